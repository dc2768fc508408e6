import { describe, expect, it } from 'vitest';
import { findMissingRuns, inpaintGapSlopes } from '../../../../core/slope/gap';

const nT = 50, nS = 200;

function fieldLinearInX(a: number, b: number): Float64Array {
  const f = new Float64Array((nT - 1) * nS);
  for (let p = 0; p < nT - 1; p++) f.fill(a + b * (p + 0.5), p * nS, (p + 1) * nS);
  return f;
}

describe('gap slopes along events (methods.md §3.5)', () => {
  // Events t(x) = t0 + a·x + b·x²/2 have slope σ = a + b·x everywhere. A cubic Hermite path with exact end values and
  // end slopes reproduces any quadratic exactly, and the edge line fit is exact for linear σ, so the inpainted slope
  // must equal a + b·x inside the gap (analytic, up to rounding and the splat's linear interpolation in t).
  it('reproduces σ = a + b·x exactly inside a 12-trace gap', () => {
    const a = 0.4, b = 0.03;
    const sigma = fieldLinearInX(a, b);
    const truth = sigma.slice();
    const conf = new Float64Array(sigma.length).fill(1);
    const live = new Uint8Array(nT).fill(1);
    for (let x = 20; x < 32; x++) live[x] = 0;
    for (let p = 19; p <= 31; p++) sigma.fill(0, p * nS, (p + 1) * nS); // what shaping alone would leave: 0
    const mask = inpaintGapSlopes(sigma, conf, live, nT, nS);
    for (let p = 19; p <= 31; p++) {
      expect(mask[p * nS + 100]).toBe(1);
      for (let t = 60; t < 140; t++) expect(Math.abs(sigma[p * nS + t] - truth[p * nS + t])).toBeLessThan(1e-9);
    }
    expect(mask[18 * nS]).toBe(0);
  });

  it('confidence drops with distance into the gap and with curvature across it', () => {
    const run = (b: number, width: number) => {
      const sigma = fieldLinearInX(0.5, b);
      const conf = new Float64Array(sigma.length).fill(1);
      const live = new Uint8Array(nT).fill(1);
      const a0 = 25 - Math.floor(width / 2);
      for (let x = a0; x < a0 + width; x++) live[x] = 0;
      inpaintGapSlopes(sigma, conf, live, nT, nS);
      return { mid: conf[24 * nS + 100], edge: conf[(a0 - 1) * nS + 100] };
    };
    const straightNarrow = run(0, 4), straightWide = run(0, 24), curvedWide = run(0.05, 24);
    expect(straightNarrow.mid).toBeGreaterThan(0.9);
    expect(straightWide.mid).toBeLessThan(straightNarrow.mid);
    expect(straightWide.mid).toBeLessThan(0.5);
    expect(curvedWide.mid).toBeLessThan(0.5 * straightWide.mid);
    expect(straightWide.edge).toBeGreaterThan(straightWide.mid);
  });

  it('a gap at the end of the gather is extrapolated along straight paths with the edge slope', () => {
    const sigma = fieldLinearInX(0.7, 0);
    const conf = new Float64Array(sigma.length).fill(1);
    const live = new Uint8Array(nT).fill(1);
    for (let x = nT - 5; x < nT; x++) live[x] = 0;
    for (let p = nT - 6; p < nT - 1; p++) sigma.fill(0, p * nS, (p + 1) * nS);
    inpaintGapSlopes(sigma, conf, live, nT, nS);
    expect(sigma[(nT - 2) * nS + 100]).toBeCloseTo(0.7, 12);
    expect(conf[(nT - 2) * nS + 100]).toBeLessThan(1);
  });

  it('finds runs of missing traces', () => {
    expect(findMissingRuns(Uint8Array.from([0, 1, 1, 0, 0, 1, 0]))).toEqual([{ first: 0, last: 0 }, { first: 3, last: 4 }, { first: 6, last: 6 }]);
  });
});
