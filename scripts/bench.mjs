// `npm run bench`: runs every test/bench/*.bench.ts in its own process (so peak memory is per benchmark),
// one after another, and collects what each prints (a markdown table) into .bench/results.md.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import { join } from 'node:path';

const root = new URL('..', import.meta.url).pathname;
const dir = join(root, 'test/bench');
const only = process.argv.slice(2);
const files = readdirSync(dir).filter((f) => f.endsWith('.bench.ts') && (only.length === 0 || only.some((o) => f.includes(o)))).sort();
const header = `Machine: ${cpus().length} × ${cpus()[0]?.model ?? '?'}, ${(totalmem() / 2 ** 30).toFixed(0)} GiB; Node ${process.version}; ${new Date().toISOString()}\n`;
let out = `# Benchmarks\n\n${header}\n`;
let failed = 0;
for (const f of files) {
  process.stdout.write(`\n== ${f}\n`);
  const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', join(dir, f)], { cwd: root, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] });
  process.stdout.write(r.stdout ?? '');
  if (r.status !== 0) {
    failed++;
    process.stdout.write(`(benchmark ${f} failed with exit code ${r.status})\n`);
  }
  out += `## ${f}\n\n${r.stdout ?? ''}\n`;
}
mkdirSync(join(root, '.bench'), { recursive: true });
writeFileSync(join(root, '.bench/results.md'), out);
process.stdout.write(`\nResults written to .bench/results.md\n`);
process.exitCode = failed ? 1 : 0;
