/**
 * End-to-end harness: `vite preview` of the built renderer (Vite's JS API, port 0) and Debian's Chromium
 * through playwright-core, on a fresh profile. Chromium missing: the suite fails under CI=true and is
 * skipped loudly otherwise (never `npx playwright install`).
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { build, preview, type PreviewServer } from 'vite';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { missingOutside } from '../support/outside';

export const CHROMIUM = '/usr/bin/chromium';
export const ROOT = resolve(import.meta.dirname, '../..');
export const RESULTS = join(ROOT, 'test-results');

export const haveChromium = existsSync(CHROMIUM);
if (!haveChromium) {
  const msg = `SKIPPING end-to-end tests: ${CHROMIUM} is missing. Install Debian's chromium (apt-get install chromium).`;
  missingOutside(msg);
}

export interface Session {
  server: PreviewServer;
  url: string;
  context: BrowserContext;
  page: Page;
  profile: string;
  errors: string[];
  close(): Promise<void>;
}

/** Builds the renderer when `npm test` has not (a direct `vitest run test/e2e`). */
export async function ensureBuild(): Promise<void> {
  if (existsSync(join(ROOT, 'dist/renderer/index.html'))) return;
  await build({ configFile: join(ROOT, 'vite.config.ts'), logLevel: 'warn' });
}

export async function startServer(): Promise<{ server: PreviewServer; url: string }> {
  await ensureBuild();
  const server = await preview({ configFile: join(ROOT, 'vite.config.ts'), preview: { port: 0, host: '127.0.0.1', strictPort: false }, logLevel: 'warn' });
  const url = server.resolvedUrls?.local[0];
  if (!url) throw new Error('vite preview gave no address');
  return { server, url };
}

/** A browser on a fresh profile, or on `profile` to simulate a restart of the app. */
export async function openBrowser(url: string, profile?: string, options: { bypassCsp?: boolean } = {}): Promise<Omit<Session, 'server' | 'url'>> {
  const dir = profile ?? mkdtempSync(join(tmpdir(), 'dipweave-e2e-'));
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: CHROMIUM,
    headless: true,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    viewport: { width: 1400, height: 860 },
    acceptDownloads: true,
    // Only the benchmark sets this: it passes its timing code as text, which the app's CSP (no eval) refuses.
    bypassCSP: options.bypassCsp ?? false,
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => { if (m.type() === 'error') errors.push(`console: ${m.text()}`); });
  await page.goto(url);
  return {
    context, page, profile: dir, errors,
    async close() {
      await context.close();
      if (!profile) rmSync(dir, { recursive: true, force: true });
    },
  };
}

export async function shot(page: Page, name: string): Promise<string> {
  mkdirSync(RESULTS, { recursive: true });
  const path = join(RESULTS, `${name}.png`);
  await page.screenshot({ path });
  return path;
}

/** Screen position (page pixels) of a trace position and time sample on the section. */
export async function sectionPoint(page: Page, trace: number, sample: number): Promise<{ x: number; y: number }> {
  const box = (await page.locator('[data-testid=section-overlay]').boundingBox())!;
  const w = await page.evaluate(() => {
    const app = (window as unknown as { __dipweave: { view: { window: { traceStart: number; traceEnd: number; sampleStart: number; sampleEnd: number } } } }).__dipweave;
    return { ...app.view.window };
  });
  // Plot margins: render/draw-section.ts MARGIN (left 58, top 36 + 12 strip, right 10, bottom 8).
  const left = 58, top = 48, width = box.width - 58 - 10, height = box.height - 48 - 8;
  return {
    x: box.x + left + ((trace - w.traceStart) / (w.traceEnd - w.traceStart)) * width,
    y: box.y + top + ((sample - w.sampleStart) / (w.sampleEnd - w.sampleStart)) * height,
  };
}
