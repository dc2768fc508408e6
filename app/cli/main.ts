/** Process entry of the bundled CLI (dist-node/main.mjs): the only place that touches process.argv and exit. */
import { availableParallelism } from 'node:os';
import { runCli } from './runner';

export async function runFromProcess(): Promise<void> {
  const cancel = { cancelled: false };
  let interrupts = 0;
  process.on('SIGINT', () => {
    cancel.cancelled = true;
    if (++interrupts > 1) process.exit(130);
  });
  const code = await runCli(process.argv.slice(2), {
    cwd: process.cwd(),
    stdout: (t) => process.stdout.write(t),
    stderr: (t) => process.stderr.write(t),
    cancel,
    cores: availableParallelism(),
  });
  process.exitCode = code;
}
