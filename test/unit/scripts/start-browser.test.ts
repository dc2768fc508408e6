// The fallback server of `npm start` in a real browser (Debian's Chromium through playwright-core): the page is
// cross-origin isolated (SharedArrayBuffer available, which the app's workers need; stack.md §4) and the
// Content Security Policy blocks inline scripts and requests to other hosts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { mkdtemp, mkdir, rm, writeFile } from 'node:fs/promises';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { createUiServer, listenLocal } from '../../../scripts/start.mjs';
import { missingOutside } from '../../support/outside';

const CHROMIUM = '/usr/bin/chromium';
const haveChromium = existsSync(CHROMIUM);
if (!haveChromium) {
  const msg = `SKIPPING browser check of the npm start fallback: ${CHROMIUM} is missing. Install Debian's chromium (apt-get install chromium).`;
  missingOutside(msg);
}

describe.skipIf(!haveChromium)('npm start fallback server in Chromium', () => {
  let dir: string;
  let server: Server;
  let url: string;
  let browser: Browser;

  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'dipweave-start-browser-'));
    await mkdir(join(dir, 'ui'));
    await mkdir(join(dir, 'samples'));
    await writeFile(join(dir, 'samples', 'demo.sgy'), new Uint8Array([1, 2, 3, 4]));
    await writeFile(
      join(dir, 'ui', 'index.html'),
      '<!doctype html><html><head><script type="module" src="./probe.js"></script>' +
        '<script>window.inlineRan = true;</script></head><body></body></html>',
    );
    await writeFile(
      join(dir, 'ui', 'probe.js'),
      `const out = { isolated: crossOriginIsolated, sab: typeof SharedArrayBuffer !== 'undefined' };
       out.demoBytes = (await (await fetch('./samples/demo.sgy')).arrayBuffer()).byteLength;
       try { await fetch('http://127.0.0.2:9/x'); out.remote = 'allowed'; } catch { out.remote = 'blocked'; }
       window.probe = out;`,
    );
    server = createUiServer({ rendererDir: join(dir, 'ui'), samplesDir: join(dir, 'samples') });
    url = await listenLocal(server, 0);
    browser = await chromium.launch({ executablePath: CHROMIUM, args: ['--no-sandbox'] });
  });

  afterAll(async () => {
    await browser?.close();
    await new Promise<void>((r) => (server ? server.close(() => r()) : r()));
    await rm(dir, { recursive: true, force: true });
  });

  it('is cross-origin isolated, serves the demo files and enforces the CSP', async () => {
    const page = await browser.newPage();
    await page.goto(url);
    await page.waitForFunction(() => (window as unknown as { probe?: unknown }).probe !== undefined, undefined, { timeout: 20_000 });
    const probe = await page.evaluate(() => (window as unknown as { probe: Record<string, unknown> }).probe);
    expect(probe).toEqual({ isolated: true, sab: true, demoBytes: 4, remote: 'blocked' });
    expect(await page.evaluate(() => (window as unknown as { inlineRan?: boolean }).inlineRan ?? false)).toBe(false);
  });
});
