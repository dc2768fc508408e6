/**
 * Catalogue of input problems. A problem is plain data first (it must survive postMessage and IPC);
 * InputFileError carries one. Tests assert on `code`, never on the wording.
 * Three kinds of error exist in Dipweave: InputFileError (bad input: shown to the user, CLI exit 2),
 * BugError (a defect: CLI exit 1) and CancelledError (silent).
 */
export type ProblemCode =
  | 'segy.file-too-small'
  | 'segy.truncated'
  | 'segy.trace-size-mismatch'
  | 'segy.samples-per-trace'
  | 'segy.sample-interval'
  | 'segy.format-code'
  | 'segy.variable-length-traces'
  | 'segy.zero-traces'
  | 'segy.non-finite-sample'
  | 'segy.header-contradiction'
  | 'segy.extended-headers'
  | 'segy.byte-order-guessed'
  | 'segy.key-not-found'
  | 'segy.bad-key'
  | 'segy.value-out-of-range'
  | 'geometry.no-spacing'
  | 'geometry.irregular'
  | 'input.bad-argument'
  | 'input.file-not-found'
  | 'input.would-overwrite'
  | 'input.bad-recipe'
  | 'input.bad-dips'
  | 'slope.no-live-pairs'
  | 'input.read-failed'
  | 'output.write-failed'
  | 'ipc.untrusted-sender';

export interface FileProblem {
  code: ProblemCode;
  severity: 'error' | 'warning';
  /** What is wrong, in one sentence. */
  message: string;
  file?: string;
  byteOffset?: number;
  traceIndex?: number;
  field?: string;
  found?: string | number;
  expected?: string;
  hint?: string;
}

/** One line a person can act on: place, problem, value found, expectation, hint, [code]. */
export function formatProblem(p: FileProblem): string {
  const where: string[] = [];
  if (p.file) where.push(p.file);
  if (p.byteOffset !== undefined) where.push(`byte ${p.byteOffset}`);
  if (p.traceIndex !== undefined) where.push(`trace ${p.traceIndex}`);
  if (p.field) where.push(p.field);
  let s = where.length ? `${where.join(', ')}: ${p.message}` : p.message;
  if (p.found !== undefined) s += ` Found: ${p.found}.`;
  if (p.expected) s += ` Expected: ${p.expected}.`;
  if (p.hint) s += ` ${p.hint}`;
  return `${s} [${p.code}]`;
}

export class InputFileError extends Error {
  readonly problem: FileProblem;
  constructor(problem: FileProblem) {
    super(formatProblem(problem));
    this.name = 'InputFileError';
    this.problem = problem;
  }
}

/** A defect in Dipweave itself; never thrown for bad user input. */
export class BugError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BugError';
  }
}

export class CancelledError extends Error {
  constructor() {
    super('cancelled');
    this.name = 'CancelledError';
  }
}

/** Core-owned cancellation token (AbortSignal is not in ES2022 lib). */
export interface CancelToken {
  readonly cancelled: boolean;
}

export function throwIfCancelled(token: CancelToken | undefined): void {
  if (token?.cancelled) throw new CancelledError();
}

export function isInputFileError(e: unknown): e is InputFileError {
  return e instanceof Error && e.name === 'InputFileError' && 'problem' in e;
}
