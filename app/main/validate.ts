/**
 * Checks on every value that arrives from the renderer. The renderer is treated as untrusted: each check
 * names the argument, the value found (shortened) and what was expected, as an InputFileError with code
 * 'input.bad-argument', whose message is what reaches the renderer.
 */
import { InputFileError } from '../../core/problems';

function describe(value: unknown): string {
  if (value === null) return 'null';
  if (typeof value === 'string') return JSON.stringify(value.length > 60 ? `${value.slice(0, 60)}…` : value);
  if (typeof value === 'number' || typeof value === 'boolean' || typeof value === 'bigint') return String(value);
  if (value instanceof Uint8Array) return `Uint8Array(${value.length})`;
  if (Array.isArray(value)) return `array(${value.length})`;
  return typeof value;
}

export function badArgument(name: string, value: unknown, expected: string): InputFileError {
  return new InputFileError({
    code: 'input.bad-argument',
    severity: 'error',
    message: `The desktop call was refused: argument ${name} is not valid.`,
    field: name,
    found: describe(value),
    expected,
  });
}

/** A non-negative safe integer not above max. */
export function checkInteger(name: string, value: unknown, min: number, max: number): number {
  if (typeof value !== 'number' || !Number.isSafeInteger(value) || value < min || value > max)
    throw badArgument(name, value, `an integer from ${min} to ${max}`);
  return value;
}

export function checkString(name: string, value: unknown, maxLength: number): string {
  if (typeof value !== 'string' || value.length === 0 || value.length > maxLength || value.includes('\0'))
    throw badArgument(name, value, `a non-empty string of at most ${maxLength} characters`);
  return value;
}

/** An id the main process issued: a prefix letter and digits. */
export function checkId(name: string, value: unknown, prefix: string): string {
  if (typeof value !== 'string' || !new RegExp(`^${prefix}[1-9][0-9]{0,9}$`).test(value))
    throw badArgument(name, value, `an id issued by the main process ("${prefix}1", "${prefix}2", …)`);
  return value;
}

export function checkBytes(name: string, value: unknown, maxBytes: number): Uint8Array {
  if (!(value instanceof Uint8Array) || value.length > maxBytes)
    throw badArgument(name, value, `a Uint8Array of at most ${maxBytes} bytes`);
  return value;
}

export function checkOneOf<T extends string>(name: string, value: unknown, allowed: readonly T[]): T {
  if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value))
    throw badArgument(name, value, `one of ${allowed.join(', ')}`);
  return value as T;
}

/** A file name without any directory part, for the save dialog's default. */
export function checkBaseName(name: string, value: unknown): string {
  const s = checkString(name, value, 200);
  if (/[/\\:*?"<>|\x00-\x1f]/.test(s) || s === '.' || s === '..' || s.startsWith('.'))
    throw badArgument(name, value, 'a plain file name without directories or reserved characters');
  return s;
}
