// Bundles the Node-side entry points (CLI, worker_threads workers, Electron main and preload) with esbuild.
// Node 20 cannot run .ts directly and tsx does not reach worker_threads (stack.md §4), so everything
// that runs under plain node is bundled into dist-node/ and dist-electron/. Runs on `npm install` (prepare).
import { build } from 'esbuild';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';

const root = new URL('..', import.meta.url).pathname;
const nodeEntries = [join(root, 'app/cli/main.ts')];
const hostDir = join(root, 'app/host');
if (existsSync(hostDir)) {
  for (const f of readdirSync(hostDir)) if (f.endsWith('.worker.ts')) nodeEntries.push(join(hostDir, f));
}

await build({
  // Flat output (dist-node/main.mjs, dist-node/<name>.worker.mjs) whatever folders the entries live in.
  entryPoints: nodeEntries.filter(existsSync).map((p) => ({ in: p, out: p.split('/').pop().replace(/\.ts$/, '') })),
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  outdir: join(root, 'dist-node'),
  outExtension: { '.js': '.mjs' },
  sourcemap: true,
  logLevel: 'warning',
  banner: { js: "import { createRequire as __cr } from 'node:module'; const require = __cr(import.meta.url);" },
});

// Electron main and preload: CommonJS, electron external; the sandboxed preload must be one file.
for (const entry of ['app/main/main.ts', 'app/preload/preload.ts']) {
  const p = join(root, entry);
  if (!existsSync(p)) continue;
  await build({
    entryPoints: [p],
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    external: ['electron'],
    outdir: join(root, 'dist-electron'),
    outExtension: { '.js': '.cjs' },
    logLevel: 'warning',
  });
}
