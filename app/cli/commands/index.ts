/** The command table. Each command lives in its own file and registers here. */
import type { CliCommand } from '../context';
import { inspectCommand } from './inspect';
import { fillCommand } from './fill';
import { dipsCommand } from './dips';
import { stitchCommand } from './stitch';

export const COMMANDS: CliCommand[] = [inspectCommand, fillCommand, stitchCommand, dipsCommand];
