/**
 * Pure argument parsing for the `dipweave` CLI: no I/O, no process access. Each command declares its
 * options as data; the parser turns argv into typed values or an InputFileError (code input.bad-argument).
 */
import { InputFileError } from '../../core/problems';

export type OptionKind = 'string' | 'number' | 'integer' | 'flag';

export interface OptionSpec {
  readonly name: string;
  readonly kind: OptionKind;
  readonly help: string;
  readonly choices?: readonly string[];
  readonly default?: string | number | boolean;
  /** Placeholder shown in help, e.g. FILE or N. */
  readonly meta?: string;
}

export interface CommandSpec {
  readonly name: string;
  readonly summary: string;
  readonly positionals: readonly { name: string; help: string; optional?: boolean }[];
  readonly options: readonly OptionSpec[];
}

export interface ParsedArgs {
  positionals: string[];
  options: Record<string, string | number | boolean | undefined>;
}

function bad(message: string, found?: string, hint?: string): InputFileError {
  return new InputFileError({ code: 'input.bad-argument', severity: 'error', message, found, hint });
}

export function parseCommandArgs(spec: CommandSpec, argv: readonly string[]): ParsedArgs {
  const options: ParsedArgs['options'] = {};
  for (const o of spec.options) if (o.default !== undefined) options[o.name] = o.default;
  const positionals: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--') {
      positionals.push(...argv.slice(i + 1));
      break;
    }
    if (!a.startsWith('--') || a === '-') {
      positionals.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
    const o = spec.options.find((x) => x.name === name);
    if (!o) throw bad(`unknown option for \`dipweave ${spec.name}\`.`, a, `See \`dipweave ${spec.name} --help\`.`);
    if (o.kind === 'flag') {
      if (eq >= 0) throw bad(`option --${name} takes no value.`, a);
      options[name] = true;
      continue;
    }
    let value: string;
    if (eq >= 0) value = a.slice(eq + 1);
    else {
      if (i + 1 >= argv.length) throw bad(`option --${name} needs a value${o.meta ? ` (${o.meta})` : ''}.`);
      value = argv[++i];
    }
    if (o.choices && !o.choices.includes(value))
      throw bad(`option --${name} must be one of ${o.choices.join(', ')}.`, value);
    if (o.kind === 'number' || o.kind === 'integer') {
      const v = Number(value);
      if (value.trim() === '' || !Number.isFinite(v) || (o.kind === 'integer' && !Number.isInteger(v)))
        throw bad(`option --${name} needs ${o.kind === 'integer' ? 'a whole number' : 'a number'}.`, value);
      options[name] = v;
    } else options[name] = value;
  }
  const required = spec.positionals.filter((p) => !p.optional).length;
  if (positionals.length < required)
    throw bad(`\`dipweave ${spec.name}\` needs ${spec.positionals.map((p) => p.name).join(' ')}.`, positionals.join(' ') || '(nothing)', `See \`dipweave ${spec.name} --help\`.`);
  if (positionals.length > spec.positionals.length)
    throw bad(`too many arguments for \`dipweave ${spec.name}\`.`, positionals.slice(spec.positionals.length).join(' '));
  return { positionals, options };
}

export function formatHelp(spec: CommandSpec): string {
  const pos = spec.positionals.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(' ');
  const lines = [`dipweave ${spec.name} ${pos} [options]`, '', spec.summary, ''];
  for (const p of spec.positionals) lines.push(`  ${p.name.padEnd(26)} ${p.help}`);
  if (spec.options.length) lines.push('', 'Options:');
  for (const o of spec.options) {
    const left = `--${o.name}${o.kind === 'flag' ? '' : ` ${o.meta ?? (o.choices ? o.choices.join('|') : o.kind.toUpperCase())}`}`;
    const def = o.default !== undefined ? ` (default ${o.default})` : '';
    lines.push(`  ${left.padEnd(26)} ${o.help}${def}`);
  }
  return lines.join('\n');
}
