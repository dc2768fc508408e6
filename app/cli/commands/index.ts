/** The command table. Each command lives in its own file and registers here. */
import type { CliCommand } from '../context';
import { inspectCommand } from './inspect';

export const COMMANDS: CliCommand[] = [inspectCommand];
