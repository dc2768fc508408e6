/**
 * Where the bundled demo line lives. The CLI opens it when the user names no file, as the app does at first
 * start. Found by walking up from this module (source tree, dist-node bundle, or an installed package).
 */
import { existsSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { DEMO_DEFAULT_FILE } from '../../core/synth/demo-segy';
import { InputFileError } from '../../core/problems';

export function findDemoFile(name: string = DEMO_DEFAULT_FILE, from: string = dirname(fileURLToPath(import.meta.url))): string {
  let dir = from;
  for (let i = 0; i < 6; i++) {
    const candidate = join(dir, 'samples', name);
    if (existsSync(candidate)) return candidate;
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  throw new InputFileError({
    code: 'input.file-not-found', severity: 'error', file: join('samples', name),
    message: 'no file was named and the bundled demo line cannot be found.',
    hint: 'Name a SEG-Y file, or run `npm run samples` in the Dipweave folder to regenerate the demo.',
  });
}

export interface ResolvedInput {
  readonly path: string;
  readonly isDemo: boolean;
}

/**
 * The input a command works on: the named file (resolved against cwd), or the demo line when none is named.
 * Says on stderr when it falls back to the demo, so the user is never misled about what was read.
 */
export function resolveInputOrDemo(named: string | undefined, cwd: string, stderr: (t: string) => void, command: string): ResolvedInput {
  if (named !== undefined) return { path: join(named.startsWith('/') ? '' : cwd, named), isDemo: false };
  const path = findDemoFile();
  stderr(`dipweave ${command}: no file named; using the demo line ${basename(path)} (synthetic data of an invented survey, see samples/README.md).\n`);
  return { path, isDemo: true };
}
