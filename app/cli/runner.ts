/**
 * The CLI runner: dispatches to commands and maps errors to exit codes
 * (0 done, 2 bad input with the coded message on stderr, 1 a bug, 130 cancelled).
 */
import { formatHelp } from './args';
import type { CliCommand, CliContext } from './context';
import { isInputFileError } from '../../core/problems';
import { COMMANDS } from './commands/index';

export const EXIT_OK = 0;
export const EXIT_BUG = 1;
export const EXIT_BAD_INPUT = 2;
export const EXIT_CANCELLED = 130;

export function topLevelHelp(commands: readonly CliCommand[]): string {
  const lines = ['dipweave: fill missing traces in 2-D seismic gathers', '', 'Commands:'];
  for (const c of commands) lines.push(`  ${c.spec.name.padEnd(10)} ${c.spec.summary}`);
  lines.push('', 'Run `dipweave COMMAND --help` for the options of one command.');
  lines.push('Filled traces are estimates, not recordings: they are flagged in every file Dipweave writes.');
  return lines.join('\n');
}

export async function runCli(argv: readonly string[], ctx: CliContext, commands: readonly CliCommand[] = COMMANDS): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    ctx.stdout(topLevelHelp(commands) + '\n');
    return name ? EXIT_OK : EXIT_BAD_INPUT;
  }
  if (name === '--version') {
    ctx.stdout('dipweave 0.1.0\n');
    return EXIT_OK;
  }
  const cmd = commands.find((c) => c.spec.name === name);
  if (!cmd) {
    ctx.stderr(`dipweave: unknown command "${name}". Commands: ${commands.map((c) => c.spec.name).join(', ')}. [input.bad-argument]\n`);
    return EXIT_BAD_INPUT;
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    ctx.stdout(formatHelp(cmd.spec) + '\n');
    return EXIT_OK;
  }
  try {
    return await cmd.run(rest, ctx);
  } catch (e) {
    if (isInputFileError(e)) {
      ctx.stderr(`dipweave ${name}: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    if (e instanceof Error && e.name === 'CancelledError') {
      ctx.stderr(`dipweave ${name}: cancelled; no output file was left behind.\n`);
      return EXIT_CANCELLED;
    }
    ctx.stderr(`dipweave ${name}: internal error (a bug in Dipweave, please report it): ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
    return EXIT_BUG;
  }
}
