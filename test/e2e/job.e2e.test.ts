// The whole job in Debian's Chromium on the demo line (samples/grv07-gap.sgy, our invented survey): open at
// first start, estimate slopes, brush an edit, link an event across the gap, undo and redo, fill with least
// squares, read the hold-out score, export, and re-open the exported file; then a restart restores the
// autosaved edits. The exported file is read back with Debian's python3-segyio (an outside reader).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PreviewServer } from 'vite';
import { haveChromium, openBrowser, RESULTS, sectionPoint, shot, startServer } from './harness';
import { missingOutside } from '../support/outside';

const PY = '/usr/bin/python3';
const havePy = spawnSync(PY, ['-c', 'import segyio'], { encoding: 'utf8' }).status === 0;
if (!havePy) {
  const msg = `SKIPPING the SEG-Y read-back in the end-to-end test: ${PY} with segyio is missing. Install Debian's python3-segyio.`;
  missingOutside(msg);
}

type AppHandle = {
  gather: { nTraces: number; nSamples: number; dtSeconds: number; data: Float32Array; keyValue: number };
  fill: { plan: { runs: { firstTrace: number; count: number; reason: string }[] }; result: { data: Float32Array } | null; unknown: Uint8Array };
  dips: { estimate: { slopeTraces: Float64Array } | null; effectiveTraces(): Float64Array | null; edits: unknown[] };
};

let server: PreviewServer;
let url = '';
let profile = '';

beforeAll(async () => {
  if (!haveChromium) return;
  ({ server, url } = await startServer());
});
afterAll(async () => {
  await server?.close();
  if (profile) rmSync(profile, { recursive: true, force: true });
});

describe.skipIf(!haveChromium)('the whole job on the demo line', () => {
  it('open, slopes, brush, link, undo/redo, fill, hold-out score, export, re-open', async () => {
    profile = mkdtempSync(join(tmpdir(), 'dipweave-e2e-job-'));
    const s = await openBrowser(url, profile);
    const { page } = s;
    try {
      // First start opens the demo gap file.
      await page.waitForSelector('[data-testid=gather-label]', { timeout: 30_000 });
      expect(await page.textContent('[data-testid=file-name]')).toBe('grv07-gap.sgy');
      expect(await page.textContent('[data-testid=gather-label]')).toContain('3101');
      expect(await page.textContent('[data-testid=legend-missing]')).toContain('16');
      await shot(page, 'e2e-01-demo-opened');

      // The gap from the plan: one run of 16 positions.
      const gap = await page.evaluate(() => {
        const app = (window as unknown as { __dipweave: AppHandle }).__dipweave;
        const r = app.fill.plan.runs.find((x) => x.reason === 'gap')!;
        return { first: r.firstTrace, last: r.firstTrace + r.count - 1 };
      });
      expect(gap.last - gap.first + 1).toBe(16);

      // Slopes.
      await page.click('[data-testid=step-dips]');
      await page.click('[data-testid=estimate]');
      await page.waitForSelector('[data-testid=slope-description]', { timeout: 60_000 });
      expect(await page.textContent('[data-testid=slope-description]')).toMatch(/plane-wave destruction.*radii 8 samples × 4 traces/);
      await page.check('[data-testid=dip-strokes]');
      await shot(page, 'e2e-02-slopes');
      // On the direct wave the local slope is the water's: apparent velocity 1500 m/s (the demo's water velocity,
      // docs/demo-and-shell.md; direct wave = trace spacing / time step per trace, common practice). Reader,
      // geometry, slope estimate, unit conversion and readout together, checked against physics.
      const direct = await page.evaluate(() => {
        const g = (window as unknown as { __dipweave: AppHandle }).__dipweave.gather;
        let bt = 0, bv = -1;
        for (let t = 0; t < g.nSamples; t++) { const v = Math.abs(g.data[30 * g.nSamples + t]); if (v > bv) { bv = v; bt = t; } }
        return bt + 0.5;
      });
      const dp = await sectionPoint(page, 30.5, direct);
      await page.mouse.move(dp.x, dp.y);
      const v = Number.parseFloat((await page.textContent('[data-testid=readout-velocity]'))!);
      expect(Math.abs(v - 1500)).toBeLessThan(0.05 * 1500);

      // Brush: set slope 0 on a short stroke left of the gap.
      await page.click('[data-testid=tool-brush]');
      const a = await sectionPoint(page, gap.first - 12, 150);
      const b = await sectionPoint(page, gap.first - 6, 170);
      await page.mouse.move(a.x, a.y);
      await page.mouse.down();
      await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 4 });
      await page.mouse.move(b.x, b.y, { steps: 4 });
      await page.mouse.up();
      await expect.poll(() => page.textContent('[data-testid=edit-count]')).toBe('1 edit');
      const brushed = await page.evaluate(([x, t]) => {
        const app = (window as unknown as { __dipweave: AppHandle }).__dipweave;
        const i = x * app.gather.nSamples + t;
        return { before: app.dips.estimate!.slopeTraces[i], after: app.dips.effectiveTraces()![i] };
      }, [gap.first - 9, 160]);
      expect(Math.abs(brushed.after)).toBeLessThan(Math.abs(brushed.before) + 1e-9);
      expect(Math.abs(brushed.after)).toBeLessThan(0.05);

      // Link the deep reflector across the gap: on each side, the sample of largest |amplitude| near 1.15–1.25 s.
      const picks = await page.evaluate(({ first, last }) => {
        const app = (window as unknown as { __dipweave: AppHandle }).__dipweave;
        const g = app.gather;
        const best = (x: number) => {
          let bt = 0, bv = -1;
          for (let t = Math.round(1.1 / g.dtSeconds); t < Math.round(1.3 / g.dtSeconds); t++) {
            const v = Math.abs(g.data[x * g.nSamples + t]);
            if (v > bv) { bv = v; bt = t; }
          }
          return bt;
        };
        return { left: { trace: first - 2 + 0.5, sample: best(first - 2) + 0.5 }, right: { trace: last + 2 + 0.5, sample: best(last + 2) + 0.5 } };
      }, gap);
      await page.click('[data-testid=tool-link]');
      const l = await sectionPoint(page, picks.left.trace, picks.left.sample);
      const r = await sectionPoint(page, picks.right.trace, picks.right.sample);
      await page.mouse.click(l.x, l.y);
      expect(await page.textContent('[data-testid=link-help]')).toContain('now click the same event');
      await page.mouse.click(r.x, r.y);
      await expect.poll(() => page.textContent('[data-testid=edit-count]')).toBe('2 edits');
      const midSlope = await page.evaluate(({ p, gap }) => {
        const app = (window as unknown as { __dipweave: AppHandle }).__dipweave;
        const x = Math.round((gap.first + gap.last) / 2);
        const t = Math.round((p.left.sample + p.right.sample) / 2);
        const i = x * app.gather.nSamples + t;
        return { est: app.dips.estimate!.slopeTraces[i], eff: app.dips.effectiveTraces()![i], chord: (p.right.sample - p.left.sample) / (p.right.trace - p.left.trace) };
      }, { p: picks, gap });
      // In the middle of the gap the linked field is near the chord slope of the two picks.
      expect(Math.abs(midSlope.eff - midSlope.chord)).toBeLessThan(Math.abs(midSlope.chord) * 0.5 + 0.2);
      await shot(page, 'e2e-03-edits');

      // Undo and redo from the keyboard.
      await page.focus('[data-testid=section]');
      await page.keyboard.press('Control+z');
      await expect.poll(() => page.textContent('[data-testid=edit-count]')).toBe('1 edit');
      await page.keyboard.press('Control+Shift+Z');
      await expect.poll(() => page.textContent('[data-testid=edit-count]')).toBe('2 edits');

      // Fill with least squares and read the hold-out score.
      await page.click('[data-testid=step-fill]');
      await page.check('[data-testid=solver-lsq]');
      const t0 = Date.now();
      await page.click('[data-testid=run-fill]');
      await page.waitForSelector('[data-testid=holdout-score]', { timeout: 120_000 });
      const fillMs = Date.now() - t0;
      const score = await page.textContent('[data-testid=holdout-score]');
      expect(score).toMatch(/^-?\d+\.\d dB$/);
      expect(Number.parseFloat(score!)).toBeGreaterThan(0);
      expect((await page.textContent('[data-testid=holdout-meaning]'))!.length).toBeGreaterThan(20);
      expect(await page.textContent('[data-testid=legend-filled]')).toContain('16');
      await shot(page, 'e2e-04-filled');
      console.log(`fill with least squares on the demo gather: ${fillMs} ms from click to score; hold-out ${score}`);
      await page.click('[data-testid=compare-difference]');
      await shot(page, 'e2e-05-difference');
      await page.click('[data-testid=compare-after]');

      // Spectra and f-k.
      await page.click('[data-testid=step-check]');
      await page.click('[data-testid=compute-spectra]');
      await page.waitForSelector('[data-testid=fk-after]', { timeout: 60_000 });
      // Score against the demo's complete line (the truth of this synthetic test), aligned and checked.
      await page.click('[data-testid=score-demo]');
      await page.waitForSelector('[data-testid=truth-score]', { timeout: 60_000 });
      const truth = (await page.textContent('[data-testid=truth-score]'))!;
      expect(truth).toMatch(/Against grv07-full\.sgy: -?\d+\.\d dB on the 16 filled positions/);
      expect(truth).toContain('reference position 1 = position 1 on screen');
      console.log(`demo gap gather against grv07-full.sgy: ${truth.match(/-?\d+\.\d dB/)![0]} (hold-out ${score})`);
      await shot(page, 'e2e-06-check');

      // Export the gather; the caution is on the export screen.
      await page.click('[data-testid=step-save]');
      expect(await page.textContent('[data-testid=export-caution]')).toContain('estimates, not recordings');
      const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid=export-gather]')]);
      const out = join(RESULTS, 'e2e-exported.sgy');
      await download.saveAs(out);
      expect(download.suggestedFilename()).toBe('grv07-gap-3101-filled.sgy');
      await shot(page, 'e2e-07-export');

      if (havePy) {
        const rb = spawnSync(PY, [join(import.meta.dirname, 'read_output.py'), out], { encoding: 'utf8', maxBuffer: 256 << 20 });
        expect(rb.status, rb.stderr).toBe(0);
        const f = JSON.parse(rb.stdout) as { n: number; ns: number; text: string; flags: number[]; ids: number[]; traces: number[][] };
        expect(f.n).toBe(144);
        expect(f.flags.filter((v) => v === 1).length).toBe(16);
        expect(f.text.toUpperCase()).toContain('ESTIMATES, NOT RECORDINGS');
        // The filled traces in the file are the ones on screen (grid order = file order here).
        const filled = await page.evaluate(() => {
          const app = (window as unknown as { __dipweave: AppHandle }).__dipweave;
          const g = app.gather;
          const rows: number[][] = [];
          for (let x = 0; x < g.nTraces; x++) if (app.fill.unknown[x]) rows.push(Array.from(app.fill.result!.data.subarray(x * g.nSamples, (x + 1) * g.nSamples)));
          return rows;
        });
        const fileFilled = f.traces.filter((_, i) => f.flags[i] === 1);
        let maxErr = 0, maxAbs = 0;
        fileFilled.forEach((tr, i) => tr.forEach((v, t) => { maxErr = Math.max(maxErr, Math.abs(v - filled[i][t])); maxAbs = Math.max(maxAbs, Math.abs(filled[i][t])); }));
        expect(maxErr).toBeLessThan(1e-5 * maxAbs); // IBM float rounding at most 2^-20 relative (methods.md §6.8)
      }

      // Re-open the exported file: the filled traces are recognised by their flag.
      await page.click('[data-testid=step-open]');
      await page.setInputFiles('[data-testid=file-input]', out);
      await expect.poll(() => page.textContent('[data-testid=file-name]')).toBe('e2e-exported.sgy');
      await expect.poll(() => page.textContent('[data-testid=legend-filled]')).toContain('16');
      expect(await page.textContent('[data-testid=legend-missing]')).toContain('0');
      await shot(page, 'e2e-08-reopened');
      await page.waitForTimeout(1200); // let the autosave timer (0.8 s) pass
      expect(s.errors.filter((e) => !e.includes('favicon'))).toEqual([]);
    } finally {
      await s.close();
    }
  });

  it('a restart restores the autosaved edits of the demo gather', async () => {
    expect(profile).not.toBe('');
    // Reopen on the same profile: the last autosaved file was the demo (re-opening the export changed nothing).
    const s = await openBrowser(url, profile);
    try {
      await s.page.waitForSelector('[data-testid=restored]', { timeout: 30_000 });
      await expect.poll(() => s.page.textContent('[data-testid=edit-count]')).toBe('2 edits');
      await shot(s.page, 'e2e-09-restored');
    } finally {
      await s.close();
    }
  });
});
