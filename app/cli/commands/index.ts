/** The command table. Each command lives in its own file and registers here. */
import type { CliCommand } from '../context';

export const COMMANDS: CliCommand[] = [];
