// Files in and out of the UI in Debian's Chromium: drag-and-drop of a SEG-Y written by Debian's python3-segyio
// (an outside writer), bad files (the coded problem is shown and nothing crashes), a recipe saved and loaded
// back, and a cancelled long fill (the UI stays usable).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PreviewServer } from 'vite';
import type { Page } from 'playwright-core';
import { haveChromium, openBrowser, RESULTS, ROOT, shot, startServer, type Session } from './harness';
import { missingOutside } from '../support/outside';

const PY = '/usr/bin/python3';
const havePy = spawnSync(PY, ['-c', 'import segyio'], { encoding: 'utf8' }).status === 0;
if (!havePy) {
  const msg = `SKIPPING the drag-and-drop test: ${PY} with segyio is missing. Install Debian's python3-segyio.`;
  missingOutside(msg);
}

let server: PreviewServer;
let url = '';
let s: Omit<Session, 'server' | 'url'>;
const dir = mkdtempSync(join(tmpdir(), 'dipweave-e2e-files-'));

beforeAll(async () => {
  if (!haveChromium) return;
  ({ server, url } = await startServer());
  s = await openBrowser(url);
  await s.page.waitForSelector('[data-testid=gather-label]', { timeout: 30_000 });
});
afterAll(async () => {
  await s?.close();
  await server?.close();
  rmSync(dir, { recursive: true, force: true });
});

/** Drops a file on the window as a browser does: a DataTransfer holding a File. */
async function dropFile(page: Page, name: string, bytes: Buffer): Promise<void> {
  const dt = await page.evaluateHandle(({ name, b64 }) => {
    const bin = atob(b64);
    const arr = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) arr[i] = bin.charCodeAt(i);
    const d = new DataTransfer();
    d.items.add(new File([arr], name, { type: 'application/octet-stream' }));
    return d;
  }, { name, b64: bytes.toString('base64') });
  await page.dispatchEvent('[data-testid=section]', 'dragover', { dataTransfer: dt });
  await page.dispatchEvent('[data-testid=section]', 'drop', { dataTransfer: dt });
}

async function lastError(page: Page): Promise<{ code: string; text: string }> {
  const n = page.locator('[data-testid=notice-error]').last();
  await n.waitFor({ timeout: 20_000 });
  return { code: (await n.getAttribute('data-code')) ?? '', text: (await n.textContent()) ?? '' };
}

describe.skipIf(!haveChromium)('files in and out', () => {
  it.skipIf(!havePy)('opens a SEG-Y dropped on the window (written by segyio)', async () => {
    const path = join(dir, 'dropped.sgy');
    const r = spawnSync(PY, [join(import.meta.dirname, 'make_segy.py'), path], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    await dropFile(s.page, 'dropped.sgy', readFileSync(path));
    await expect.poll(() => s.page.textContent('[data-testid=file-name]'), { timeout: 20_000 }).toBe('dropped.sgy');
    // Shot 1 of the file: 96 channel positions, 12 of them absent (make_segy.py), 12.5 m apart.
    expect(await s.page.textContent('[data-testid=gather-label]')).toContain('1 of 2 · 96 positions');
    expect(await s.page.textContent('[data-testid=legend-missing]')).toContain('12');
    await shot(s.page, 'e2e-10-dropped');
    await s.page.click('[data-testid=next-gather]');
    await expect.poll(() => s.page.textContent('[data-testid=gather-label]')).toContain('2 of 2');
    expect(await s.page.textContent('[data-testid=legend-missing]')).toContain('0');
  });

  it('zooms about the cursor, pans by keys and reads out time, position and amplitude under the cursor', async () => {
    const page = s.page;
    type W = { traceStart: number; traceEnd: number; sampleStart: number; sampleEnd: number };
    const win = () => page.evaluate(() => ({ ...(window as unknown as { __dipweave: { view: { window: W } } }).__dipweave.view.window }));
    const box = (await page.locator('[data-testid=section-overlay]').boundingBox())!;
    const before = await win();
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.wheel(0, -300);
    await expect.poll(async () => { const w = await win(); return w.traceEnd - w.traceStart; }).toBeLessThan(before.traceEnd - before.traceStart);
    const zoomed = await win();
    await page.focus('[data-testid=section]');
    await page.keyboard.press('ArrowRight');
    await expect.poll(async () => (await win()).traceStart).toBeGreaterThan(zoomed.traceStart);
    // Readout: time in ms from the sample under the cursor, 2 ms sampling (make_segy.py).
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    const text = (await page.textContent('[data-testid=readout]'))!;
    expect(text).toMatch(/t [\d.]+ ms/);
    expect(text).toMatch(/position [\d.]+ m/);
    expect(text).toMatch(/amplitude -?[\d.e+-]+/);
    await page.keyboard.press('Home');
    await expect.poll(win).toEqual(before);
  });

  it('shows the coded problem for bad files and keeps working', async () => {
    const before = await s.page.textContent('[data-testid=file-name]');
    // Smaller than the 3600 bytes of the textual and binary headers.
    await dropFile(s.page, 'tiny.sgy', Buffer.alloc(1000, 0x40));
    let e = await lastError(s.page);
    expect(e.code).toBe('segy.file-too-small');
    expect(e.text).toContain('tiny.sgy');
    await shot(s.page, 'e2e-11-bad-file');
    // A demo file cut in the middle of a trace.
    const demo = readFileSync(join(ROOT, 'samples/grv07-gap.sgy'));
    await dropFile(s.page, 'cut.sgy', demo.subarray(0, 3600 + 1500 + 777));
    e = await lastError(s.page);
    expect(e.code).toMatch(/^segy\./);
    // The previous file is still on screen and the app still works.
    expect(await s.page.textContent('[data-testid=file-name]')).toBe(before);
    await s.page.click('[data-testid=step-look]');
    await s.page.click('[data-testid=mode-both]');
    await shot(s.page, 'e2e-12-still-working');
    expect(s.errors.filter((x) => x.startsWith('pageerror'))).toEqual([]);
  });

  it('saves a recipe and loads it back; a bad recipe is refused with its code', async () => {
    const page = s.page;
    await page.click('[data-testid=step-open]');
    await page.click('[data-testid=demo-grv07-gap\\.sgy]');
    await expect.poll(() => page.textContent('[data-testid=file-name]')).toBe('grv07-gap.sgy');
    await page.click('[data-testid=step-fill]');
    await page.fill('[data-testid=max-iterations]', '123');
    await page.click('[data-testid=step-save]');
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid=save-recipe]')]);
    const path = join(RESULTS, 'e2e-recipe.json');
    await dl.saveAs(path);
    const recipe = JSON.parse(readFileSync(path, 'utf8'));
    expect(recipe.format).toBe('dipweave-recipe');
    expect(recipe.fill.lsq.maxIterations).toBe(123);
    // Change the setting, then load the recipe: the saved value comes back.
    await page.click('[data-testid=step-fill]');
    await page.fill('[data-testid=max-iterations]', '7');
    await page.click('[data-testid=step-save]');
    await page.setInputFiles('[data-testid=recipe-input]', path);
    await page.click('[data-testid=step-fill]');
    await expect.poll(() => page.inputValue('[data-testid=max-iterations]')).toBe('123');
    // A recipe with an unknown field is refused (strict reading) with its code.
    const badPath = join(dir, 'bad.recipe.json');
    writeFileSync(badPath, JSON.stringify({ ...recipe, fill: { ...recipe.fill, sovler: 'lsq' } }));
    await page.click('[data-testid=step-save]');
    await page.setInputFiles('[data-testid=recipe-input]', badPath);
    const e = await lastError(page);
    expect(e.code).toBe('input.bad-recipe');
  });

  it('exports every gather of the decimated demo, the dip field and a PNG of the view', async () => {
    const page = s.page;
    await page.click('[data-testid=step-open]');
    await page.click('[data-testid=demo-grv07-decimated\\.sgy]');
    await expect.poll(() => page.textContent('[data-testid=file-name]')).toBe('grv07-decimated.sgy');
    // The headers hold every second group only (25 m): nothing is missing on their grid until k = 2 is given.
    expect(await page.textContent('[data-testid=legend-missing]')).toBe('missing 0');
    await page.click('[data-testid=step-fill]');
    await page.fill('[data-testid=factor]', '2');
    await page.press('[data-testid=factor]', 'Enter');
    await expect.poll(() => page.textContent('[data-testid=plan-summary]')).toContain('Regular decimation by 2');
    expect(await page.textContent('[data-testid=legend-missing]')).toBe('missing 71');
    await shot(page, 'e2e-15-decimated-plan');
    await page.click('[data-testid=step-dips]');
    await page.click('[data-testid=estimate]');
    await page.waitForSelector('[data-testid=slope-description]', { timeout: 60_000 });
    expect(await page.textContent('[data-testid=slope-description]')).toContain('coarse grid');
    await page.click('[data-testid=step-save]');
    const [all] = await Promise.all([page.waitForEvent('download', { timeout: 180_000 }), page.click('[data-testid=export-all]')]);
    const allPath = join(RESULTS, 'e2e-all-gathers.sgy');
    await all.saveAs(allPath);
    const [dips] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid=export-slopes]')]);
    const dipsPath = join(RESULTS, 'e2e-dips.sgy');
    await dips.saveAs(dipsPath);
    expect(dips.suggestedFilename()).toMatch(/dips-ms-per-trace\.sgy$/);
    const [png] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid=export-png]')]);
    const pngPath = join(RESULTS, 'e2e-view.png');
    await png.saveAs(pngPath);
    expect(readFileSync(pngPath).subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a'); // PNG signature (PNG spec)
    await shot(page, 'e2e-16-exported-all');
    if (havePy) {
      const rb = (p: string) => {
        const r = spawnSync(PY, [join(import.meta.dirname, 'read_output.py'), p], { encoding: 'utf8', maxBuffer: 512 << 20 });
        expect(r.status, r.stderr).toBe(0);
        return JSON.parse(r.stdout) as { n: number; ns: number; text: string; flags: number[]; traces: number[][] };
      };
      const inFile = rb(join(ROOT, 'samples/grv07-decimated.sgy'));
      const outAll = rb(allPath);
      const filled = outAll.flags.filter((v) => v === 1).length;
      // Every gather filled: the output holds the recorded traces plus one new trace between each recorded pair.
      expect(outAll.n).toBe(inFile.n + filled);
      expect(filled).toBeGreaterThan(0.8 * inFile.n);
      expect(outAll.text.toUpperCase()).toContain('ESTIMATES, NOT RECORDINGS');
      const outDips = rb(dipsPath);
      expect(outDips.text.toUpperCase()).toContain('SLOPE FIELD');
      expect(outDips.text.toUpperCase()).toContain('MS/TRACE');
      // One slope trace per grid position of the gather on screen.
      const nGrid = await page.evaluate(() => (window as unknown as { __dipweave: { gather: { nTraces: number } } }).__dipweave.gather.nTraces);
      expect(outDips.n).toBe(nGrid);
    }
  });

  it('cancels a long network fill and stays usable', async () => {
    const page = s.page;
    await page.click('[data-testid=step-fill]');
    await page.check('[data-testid=solver-net]');
    await page.fill('[data-testid=net-steps]', '200000');
    await page.click('[data-testid=run-fill]');
    await page.waitForSelector('[data-testid=fill-progress]', { timeout: 20_000 });
    // Let the network train a little so the loss curve has points.
    await expect.poll(() => page.evaluate(() => (window as unknown as { __dipweave: { fill: { loss: unknown[] } } }).__dipweave.fill.loss.length), { timeout: 60_000 }).toBeGreaterThan(3);
    await shot(page, 'e2e-13-network-running');
    const t0 = Date.now();
    await page.click('[data-testid=cancel-fill]');
    await page.waitForSelector('[data-testid=run-fill]', { timeout: 20_000 });
    const cancelMs = Date.now() - t0;
    console.log(`network fill cancelled after ${cancelMs} ms`);
    expect(await page.locator('[data-testid=notice-info]').last().textContent()).toContain('cancelled');
    expect(await page.locator('[data-testid=fill-result]').count()).toBe(0);
    // Still usable: a least-squares fill runs to the end afterwards.
    await page.check('[data-testid=solver-lsq]');
    await page.click('[data-testid=run-fill]');
    await page.waitForSelector('[data-testid=holdout-score]', { timeout: 120_000 });
    await shot(page, 'e2e-14-after-cancel');
  });
});
