// `node scripts/start.mjs` as a user runs it (npm start), here where the Electron binary is absent: it says
// so, serves the built UI on 127.0.0.1 and prints the address, which then answers with the isolation headers.
import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { electronStatus } from '../../../scripts/start.mjs';

const root = new URL('../../../', import.meta.url).pathname;
const built = existsSync(`${root}dist/renderer/index.html`);
if (!built) console.warn('\n*** SKIPPING the npm start run: dist/renderer is missing (run npm run build first; npm test does).\n');

describe.skipIf(!built || electronStatus().available)('npm start without the Electron binary', () => {
  it('explains, serves the UI on 127.0.0.1 and prints the address', async () => {
    const child = spawn(process.execPath, [`${root}scripts/start.mjs`], { cwd: root, env: { ...process.env, DIPWEAVE_PORT: '0' }, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    try {
      const url = await new Promise<string>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`no address printed within 20 s; output so far:\n${out}`)), 20_000);
        child.stdout.on('data', (d: Buffer) => {
          out += d.toString();
          const m = /running at (http:\/\/127\.0\.0\.1:\d+\/)/.exec(out);
          if (m) {
            clearTimeout(timer);
            resolve(m[1]);
          }
        });
        child.on('exit', (code) => reject(new Error(`start.mjs exited with ${code}:\n${out}`)));
      });
      expect(out).toMatch(/Electron cannot start here: .*(path\.txt|missing|not installed)/);
      const res = await fetch(url);
      expect(res.status).toBe(200);
      expect(res.headers.get('cross-origin-opener-policy')).toBe('same-origin');
      expect(res.headers.get('cross-origin-embedder-policy')).toBe('require-corp');
      expect(await res.text()).toMatch(/<script type="module"/); // the built page, not an error text
    } finally {
      child.kill('SIGTERM');
    }
  });
});
