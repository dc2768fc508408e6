// Figures for the desktop renderer in Debian's Chromium (playwright-core): redraw of a 1000×500 gather with
// the dip layer (aim < 50 ms), pan redraw, slope estimate and least-squares fill on the demo gather, from
// the click to the result on screen. Needs the build (`npm run bench` runs it first). Prints a markdown table.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { addHyperbola } from '../../core/synth/events';
import { Rng } from '../../core/rng';
import { openBrowser, startServer, haveChromium } from '../e2e/harness';

if (!haveChromium) {
  console.log('| figure | value |\n|---|---|\n| renderer benchmarks | skipped: /usr/bin/chromium missing |');
  process.exit(process.env.CI === 'true' ? 1 : 0);
}

/** A minimal big-endian SEG-Y (rev 1, IEEE floats) written by hand: receiver X in bytes 81–84, field record 1. */
function segyBytes(data: Float64Array, nTraces: number, nSamples: number, dtUs: number, spacingM: number): Uint8Array {
  const traceBytes = 240 + 4 * nSamples;
  const out = new Uint8Array(3600 + nTraces * traceBytes);
  out.fill(0x40, 0, 3200); // EBCDIC spaces
  const v = new DataView(out.buffer);
  v.setInt16(3216, dtUs);
  v.setInt16(3220, nSamples);
  v.setInt16(3224, 5);
  v.setInt16(3500, 0x0100);
  v.setInt16(3502, 1);
  for (let x = 0; x < nTraces; x++) {
    const at = 3600 + x * traceBytes;
    v.setInt32(at + 0, x + 1);
    v.setInt32(at + 8, 1);
    v.setInt32(at + 12, x + 1);
    v.setInt16(at + 28, 1);
    v.setInt32(at + 36, Math.round(100 + x * spacingM));
    v.setInt16(at + 70, 1);
    v.setInt32(at + 80, Math.round(x * spacingM));
    v.setInt16(at + 114, nSamples);
    v.setInt16(at + 116, dtUs);
    for (let t = 0; t < nSamples; t++) v.setFloat32(at + 240 + 4 * t, data[x * nSamples + t]);
  }
  return out;
}

const median = (a: number[]) => a.slice().sort((p, q) => p - q)[a.length >> 1];
const nTraces = 1000, nSamples = 500;
const d = new Float64Array(nTraces * nSamples);
for (const [t0, v] of [[80, 6], [200, 8], [330, 11]] as const) addHyperbola(d, nTraces, nSamples, { t0Samples: t0, velocityTracesPerSample: v, apexTrace: -50, fpCyclesPerSample: 0.06 });
const rng = new Rng(7);
for (let i = 0; i < d.length; i++) d[i] += 0.02 * rng.normal();
const dir = mkdtempSync(join(tmpdir(), 'dipweave-bench-'));
const file = join(dir, 'bench-1000x500.sgy');
writeFileSync(file, segyBytes(d, nTraces, nSamples, 2000, 10));

const { server, url } = await startServer();
const s = await openBrowser(url, undefined, { bypassCsp: true });
const page = s.page;
const rows: string[] = [];
try {
  await page.waitForSelector('[data-testid=gather-label]', { timeout: 60_000 });

  // Demo gather (144 × 750): slopes and fill from the click to the result on screen.
  await page.click('[data-testid=step-dips]');
  const est: number[] = [];
  for (let r = 0; r < 3; r++) {
    const t0 = Date.now();
    await page.click('[data-testid=estimate]');
    await page.waitForFunction('!window.__dipweave.dips.running && document.querySelector("[data-testid=slope-description]")', null, { timeout: 120_000 });
    est.push(Date.now() - t0);
  }
  await page.click('[data-testid=step-fill]');
  const fill: number[] = [];
  let score = '';
  for (let r = 0; r < 3; r++) {
    const t0 = Date.now();
    await page.click('[data-testid=run-fill]');
    await page.waitForSelector('[data-testid=holdout-score]', { timeout: 120_000 });
    fill.push(Date.now() - t0);
    score = (await page.textContent('[data-testid=holdout-score]')) ?? '';
  }
  rows.push(`| demo gather 144 × 750: slope estimate, click to field on screen | ${median(est)} ms (median of ${est.length}; min ${Math.min(...est)}) |`);
  rows.push(`| demo gather 144 × 750: least-squares fill with hold-out check, click to score on screen | ${median(fill)} ms (median of ${fill.length}; min ${Math.min(...fill)}); hold-out ${score} |`);

  // 1000 × 500 gather with the dip layer.
  await page.click('[data-testid=step-open]');
  await page.setInputFiles('[data-testid=file-input]', file);
  await page.waitForFunction('document.querySelector("[data-testid=gather-label]")?.textContent?.includes("1000 positions")', null, { timeout: 60_000 });
  await page.click('[data-testid=step-dips]');
  const t0 = Date.now();
  await page.click('[data-testid=estimate]');
  await page.waitForSelector('[data-testid=slope-description]', { timeout: 300_000 });
  const est1000 = Date.now() - t0;
  // Passed as text: tsx (esbuild keepNames) would wrap named arrow functions in a __name() the page lacks.
  const timing = (await page.evaluate(`(async () => {
    const app = window.__dipweave;
    const perf = document.querySelector('[data-testid=draw-ms]');
    // Svelte runs effects in a microtask after a state change; two more microtasks later the canvas is drawn.
    const drawn = async () => { await new Promise((r) => queueMicrotask(r)); await new Promise((r) => queueMicrotask(r)); };
    const frame = () => new Promise((r) => requestAnimationFrame(() => setTimeout(r, 0)));
    const settle = () => new Promise((r) => setTimeout(r, 50));
    app.view.dipLayer = true;
    app.view.dipStrokes = true;
    await settle();
    const full = [], drawOnly = [], pan = [], fullFrame = [];
    for (let i = 0; i < 15; i++) {
      await settle();
      const a = performance.now();
      app.view.dipOpacity = 0.4 + 0.02 * (i % 10); // forces the picture (colours + dip blend) to be rebuilt
      await drawn();
      full.push(performance.now() - a);
      drawOnly.push(Number(perf.dataset.ms));
      await frame();
      fullFrame.push(performance.now() - a);
    }
    const gain = [];
    for (let i = 0; i < 9; i++) {
      await settle();
      const a = performance.now();
      app.view.gain = { ...app.view.gain, clipPercentile: 97 + 0.25 * (i % 4) }; // new gain: percentile, scale, picture
      await drawn();
      gain.push(performance.now() - a);
    }
    app.view.zoom(2, 500, 250);
    for (let i = 0; i < 15; i++) {
      await settle();
      const a = performance.now();
      app.view.pan(i % 2 ? 20 : -20, 0);
      await drawn();
      pan.push(performance.now() - a);
    }
    const med = (x) => x.slice().sort((p, q) => p - q)[x.length >> 1];
    return { full: med(full), fullMax: Math.max(...full), draw: med(drawOnly), pan: med(pan), frame: med(fullFrame), gain: med(gain) };
  })()`)) as { full: number; fullMax: number; draw: number; pan: number; frame: number; gain: number };
  rows.push(`| 1000 × 500: slope estimate, click to field on screen | ${est1000} ms |`);
  rows.push(`| 1000 × 500 with dip layer and strokes: full redraw (colours, dip blend, blit, strokes, axes), state change to canvas drawn | ${timing.full.toFixed(1)} ms median of 15 (max ${timing.fullMax.toFixed(1)}); aim < 50 ms |`);
  rows.push(`| 1000 × 500: new display gain (percentile clip, gain, colours, dip blend, draw) | ${timing.gain.toFixed(1)} ms median of 9 |`);
  rows.push(`| 1000 × 500: canvas drawing alone (blit, strokes, axes) | ${timing.draw.toFixed(1)} ms |`);
  rows.push(`| 1000 × 500: full redraw until the next frame is shown (includes the browser's own paint, software rendering here) | ${timing.frame.toFixed(1)} ms |`);
  rows.push(`| 1000 × 500 zoomed ×2: pan redraw | ${timing.pan.toFixed(1)} ms |`);
} finally {
  await s.close();
  await server.close();
  rmSync(dir, { recursive: true, force: true });
}
console.log('| figure (Chromium, headless, software rendering) | value |');
console.log('|---|---|');
for (const r of rows) console.log(r);
