/**
 * Slopes on real recordings nobody on the team made (../shared/data/README.md):
 *  - f3.sgy: crop of the Netherlands offshore F3 block post-stack volume (Dutch government, CC BY-SA 3.0; crop from
 *    the segyio test data, equinor/segyio test-data/f3.sgy), read as inline and crossline gathers;
 *  - WL1.sgy: one shot gather from a physical (sand-tank) seismic model, Lorenzo, Smolkin, White, Chollett & Sun,
 *    "Benchmark hydrogeophysical data from a physical seismic model", Computers & Geosciences
 *    (gllore/lorenzo-benchmarks WL1.sgy).
 * Checks: the destruction residual of the data with the estimated slopes is below the data's own energy and below
 * what zero slope (and, for WL1, the best single constant slope) leaves; the field is stable when radii change.
 * Residual ratio ρ = Σ r² / Σ (u_p² + u_{p+1}²) over stencils that fit, with r from the tested operator of core/pwd
 * (integer+fraction split, so steep slopes are fair); incoherent traces give ρ ≈ 1, a perfectly destroyed field 0.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryByteSource } from '../../../core/segy/byte-source';
import { indexGathers, openSegy, parseGatherKey, readGather, type LoadedGather } from '../../../core/segy';
import { buildPwdPlan, pwdApply } from '../../../core/pwd/operator';
import { estimateSlopes } from '../../../core/slope/estimate';
import { missingOutside } from '../../support/outside';

const DATA = join(new URL('../../../', import.meta.url).pathname, '../shared/data');
const have = existsSync(join(DATA, 'f3.sgy')) && existsSync(join(DATA, 'WL1.sgy'));
if (!have) {
  const msg = `../shared/data (f3.sgy, WL1.sgy) not found at ${DATA}: real-data slope checks skipped`;
  missingOutside(msg);
}

async function gathers(name: string, key: string): Promise<LoadedGather[]> {
  const path = join(DATA, name);
  const file = await openSegy(memoryByteSource(name, new Uint8Array(readFileSync(path))));
  const index = await indexGathers(file, parseGatherKey(key));
  const out: LoadedGather[] = [];
  for (let i = 0; i < index.gathers.length; i++) out.push(await readGather(file, index, i));
  return out;
}

function residualRatio(u: Float64Array, sigma: Float64Array, nT: number, nS: number): number {
  const plan = buildPwdPlan(sigma, nT, nS, { order: 1, split: true });
  const r = pwdApply(plan, new Float64Array(sigma.length), u);
  let er = 0, eu = 0;
  for (let p = 0; p < nT - 1; p++) for (let t = 0; t < nS; t++) {
    const i = p * nS + t;
    if (!plan.valid[i]) continue;
    er += r[i] * r[i];
    eu += u[i] * u[i] + u[i + nS] * u[i + nS];
  }
  return er / eu;
}

const median = (a: number[]) => { const b = a.slice().sort((x, y) => x - y); return b[Math.floor(b.length / 2)]; };

describe.skipIf(!have)('slopes on real data', () => {
  it('F3 inline and crossline gathers: residual below zero slope on every gather and about 0.3–0.45 of the data', async () => {
    for (const key of ['inline', 'crossline']) {
      const gs = await gathers('f3.sgy', key);
      // F3 crop: 23 inlines × 18 crosslines (README); every gather is checked.
      expect(gs.length).toBe(key === 'inline' ? 23 : 18);
      let sumEst = 0, sumZero = 0;
      for (const g of gs) {
        const u = Float64Array.from(g.data);
        const f = estimateSlopes(u, g.nTraces, g.nSamples, new Uint8Array(g.nTraces).fill(1));
        const est = residualRatio(u, f.slopePairs, g.nTraces, g.nSamples);
        const zero = residualRatio(u, new Float64Array(f.slopePairs.length), g.nTraces, g.nSamples);
        expect(est).toBeLessThan(zero * 1.02); // never worse than flat (2 % slack: slopes are smoothed)
        sumEst += est;
        sumZero += zero;
      }
      // measured 2026-12: inline mean 0.41 (zero slope 0.44), crossline 0.29 (0.31): the crop is near-flat and noisy
      expect(sumEst / gs.length).toBeLessThan(0.5);
      expect(sumEst).toBeLessThan(0.97 * sumZero);
    }
  });

  /**
   * Stability: one radius step ((6,3)→(8,4) and (8,4)→(12,5) samples × traces) moves the confident slopes by less
   * than half of the field's own spread (median |σ − median σ|), and the change shrinks as the radii grow. Measured:
   * F3 crossline 0 about 0.33–0.38 of the spread, WL1 about 0.21.
   */
  const stability = (u: Float64Array, nT: number, nS: number) => {
    const live = new Uint8Array(nT).fill(1);
    const fs = [[6, 3], [8, 4], [12, 5]].map(([rt, rx]) => estimateSlopes(u, nT, nS, live, { radiusTimeSamples: rt, radiusTraces: rx }));
    const steps: { change: number; spread: number; n: number }[] = [];
    for (let a = 0; a + 1 < fs.length; a++) {
      const d: number[] = [], spread: number[] = [];
      const m = median(Array.from(fs[a].slopeTraces));
      for (let i = 0; i < fs[a].slopeTraces.length; i++) {
        spread.push(Math.abs(fs[a].slopeTraces[i] - m));
        if (fs[a].confidence[i] > 0.5 && fs[a + 1].confidence[i] > 0.5) d.push(Math.abs(fs[a].slopeTraces[i] - fs[a + 1].slopeTraces[i]));
      }
      steps.push({ change: median(d), spread: median(spread), n: d.length });
    }
    return steps;
  };

  it('F3: stable when the radii change', async () => {
    const [g] = await gathers('f3.sgy', 'crossline');
    const steps = stability(Float64Array.from(g.data), g.nTraces, g.nSamples);
    for (const st of steps) {
      expect(st.n).toBeGreaterThan(500);
      expect(st.change).toBeLessThan(0.5 * st.spread);
    }
    expect(steps[1].change).toBeLessThanOrEqual(steps[0].change);
  });

  it('WL1 shot gather: steep slopes found; residual below zero slope and below the best constant slope', async () => {
    const [g] = await gathers('WL1.sgy', 'record');
    const nT = g.nTraces, nS = g.nSamples;
    const u = Float64Array.from(g.data);
    const f = estimateSlopes(u, nT, nS, new Uint8Array(nT).fill(1));
    const est = residualRatio(u, f.slopePairs, nT, nS);
    let bestConst = Infinity;
    for (let s = 0; s <= 20; s += 1) bestConst = Math.min(bestConst, residualRatio(u, new Float64Array(f.slopePairs.length).fill(s), nT, nS));
    const zero = residualRatio(u, new Float64Array(f.slopePairs.length), nT, nS);
    // measured: est 0.61, zero slope 0.87; trace-to-trace coherence of this physical-model gather is low
    // (even the best constant slope leaves more than half), so "much below" here means well below flat.
    expect(est).toBeLessThan(0.75 * zero);
    expect(est).toBeLessThan(bestConst);
    // The event moveout is steep: 7–13 samples per trace dominate the coherent part (13 µs sampling, 1.3 cm traces).
    const conf: number[] = [];
    for (let i = 0; i < f.slopeTraces.length; i++) if (f.confidence[i] > 0.6) conf.push(f.slopeTraces[i]);
    const m = median(conf);
    expect(m).toBeGreaterThan(5);
    expect(m).toBeLessThan(16);
    // Bounded, and the steepest slopes are backed by the data: |σ| never exceeds twice the measured steepest
    // slope (itself below the 32 samples/trace the measure accepts), and slopes steeper than 20 samples/trace
    // carry a mean confidence above 0.5 (measured 2026-12-01: largest 43.3, steepest measured 21.6, mean
    // confidence 0.67–0.73 beyond 20). Earlier versions returned hundreds of samples per trace here; this
    // check did not fail on the code at the start of the quiet-zone work (commit 5f562e2), it guards regressions.
    let mx = 0, cs = 0, cn = 0;
    for (let i = 0; i < f.slopePairs.length; i++) {
      const a = Math.abs(f.slopePairs[i]);
      mx = Math.max(mx, a);
      if (a > 20) { cs += f.confidencePairs[i]; cn++; }
    }
    expect(f.info.maxSlopeSamplesPerTrace).toBeLessThan(32);
    expect(mx).toBeLessThanOrEqual(2 * f.info.maxSlopeSamplesPerTrace + 1e-9);
    if (cn > 0) expect(cs / cn).toBeGreaterThan(0.5);
  });

  it('WL1: stable when the radii change', async () => {
    const [g] = await gathers('WL1.sgy', 'record');
    const steps = stability(Float64Array.from(g.data), g.nTraces, g.nSamples);
    for (const st of steps) {
      expect(st.n).toBeGreaterThan(5000);
      expect(st.change).toBeLessThan(0.5 * st.spread);
    }
    expect(steps[1].change).toBeLessThanOrEqual(steps[0].change);
  });
});
