#!/usr/bin/env node
// Thin shim: the CLI is bundled into dist-node/ by `npm install` (prepare) or `npm run build:node`.
import { existsSync } from 'node:fs';
const entry = new URL('../dist-node/main.mjs', import.meta.url);
if (!existsSync(entry)) {
  process.stderr.write('dipweave: the command-line bundle is missing. Run `npm install` or `npm run build:node` in the Dipweave folder.\n');
  process.exit(1);
}
const { runFromProcess } = await import(entry.href);
await runFromProcess();
