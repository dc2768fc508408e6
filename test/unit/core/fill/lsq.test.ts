import { describe, expect, it } from 'vitest';
import { solveLeastSquares } from '../../../../core/fill/lsq';
import { gapRmsRatio } from '../../../../core/fill/amplitude';
import { addHyperbola, addPlaneWave, hyperbolaSlopeField, type HyperbolaSpec } from '../../../../core/synth/events';
import { snrDb } from '../../../../core/quality/snr';
import { CancelledError } from '../../../../core/problems';

const nT = 61, nS = 400;

function decimated(R: number): Uint8Array {
  const m = new Uint8Array(nT);
  for (let x = 0; x < nT; x++) m[x] = x % R ? 1 : 0;
  m[nT - 1] = 0;
  return m;
}
function centredGap(G: number): Uint8Array {
  const m = new Uint8Array(nT);
  const a = Math.floor((nT - G) / 2);
  m.fill(1, a, a + G);
  return m;
}
function fill(u: Float64Array, slopes: Float64Array, unk: Uint8Array, order: 1 | 2 = 2) {
  const d = u.slice();
  const hidden: number[] = [];
  for (let x = 0; x < nT; x++) if (unk[x]) { hidden.push(x); d.fill(0, x * nS, (x + 1) * nS); }
  const r = solveLeastSquares({ data: d, nTraces: nT, nSamples: nS, unknownTraces: unk, slopePairs: slopes }, { order });
  return { r, snr: snrDb(u, r.data, hidden, nS), d };
}

// Hyperbolas of methods.md §6.6 (v = 0.5 traces/sample, t0 = 100, 200, 300; max slope ≈ 1.5).
const HYP: HyperbolaSpec[] = [100, 200, 300].map((t0) => ({ t0Samples: t0, velocityTracesPerSample: 0.5, apexTrace: 0, fpCyclesPerSample: 0.08 }));
const hyp = () => {
  const u = new Float64Array(nT * nS);
  for (const e of HYP) addHyperbola(u, nT, nS, e);
  const pos = Array.from({ length: nT - 1 }, (_, p) => p + 0.5);
  return { u, slopes: hyperbolaSlopeField(new Float64Array((nT - 1) * nS), pos, nS, HYP) };
};

describe('least-squares fill with exact slopes (analytic truth, core/synth/events.ts)', () => {
  // methods.md §6.5 [D]: constant σ ∈ {0.5, 1, 1.5}, f_p ≤ 0.1, R = 2..4, exact slope: SNR > 75 dB (N = 1).
  it.each([0.5, 1, 1.5])('plane wave σ = %s decimated by 2, 3, 4: SNR on the filled traces > 75 dB (order 1 and 2)', (sigma) => {
    const u = addPlaneWave(new Float64Array(nT * nS), nT, nS, { t0Samples: 100, slopeSamplesPerTrace: sigma, fpCyclesPerSample: 0.1 });
    const slopes = new Float64Array((nT - 1) * nS).fill(sigma);
    for (const R of [2, 3, 4]) for (const order of [1, 2] as const) expect(fill(u, slopes, decimated(R), order).snr).toBeGreaterThan(75);
  });

  // methods.md §6.5 [D]: hyperbolas with exact slope, decimation R = 2/3/4 > 60 dB; centred 16-trace gap > 40 dB.
  it('hyperbolas decimated by 2, 3, 4: > 60 dB; centred 16-trace gap: > 40 dB with amplitude kept (RMS ratio 0.95–1.05)', () => {
    const { u, slopes } = hyp();
    for (const R of [2, 3, 4]) expect(fill(u, slopes, decimated(R)).snr).toBeGreaterThan(60);
    const gap = centredGap(16);
    const { r, snr } = fill(u, slopes, gap);
    expect(snr).toBeGreaterThan(40);
    const ratio = gapRmsRatio(r.data, gap, nS) / gapRmsRatio(u, gap, nS);
    expect(ratio).toBeGreaterThan(0.95);
    expect(ratio).toBeLessThan(1.05);
  });

  it('holds known traces exactly and reports iterations, convergence and block counts', () => {
    const { u, slopes } = hyp();
    const gap = centredGap(8);
    const { r, d } = fill(u, slopes, gap);
    let changed = 0;
    for (let x = 0; x < nT; x++) if (!gap[x]) for (let t = 0; t < nS; t++) if (r.data[x * nS + t] !== d[x * nS + t]) changed++;
    expect(changed).toBe(0);
    expect(r.converged).toBe(true);
    expect(r.iterations).toBeGreaterThan(0);
    expect(r.iterations).toBeLessThan(300);
    expect(r.details.blocks).toBe(1);
  });

  it('the painted start needs fewer iterations than a zero start and ends no worse (undamped, default stopping rule)', () => {
    const { u, slopes } = hyp();
    const gap = centredGap(16);
    const d = u.slice();
    d.fill(0, 22 * nS, 38 * nS);
    const run = (paint: boolean) => solveLeastSquares({ data: d, nTraces: nT, nSamples: nS, unknownTraces: gap, slopePairs: slopes }, { paint, damping: 0, maxIterations: 3000 });
    const withPaint = run(true), fromZero = run(false);
    const hidden = Array.from({ length: 16 }, (_, i) => 22 + i);
    expect(withPaint.iterations).toBeLessThan(fromZero.iterations);
    expect(snrDb(u, withPaint.data, hidden, nS)).toBeGreaterThan(snrDb(u, fromZero.data, hidden, nS) - 1);
  });

  it('cancels', () => {
    const { u, slopes } = hyp();
    expect(() => solveLeastSquares({ data: u, nTraces: nT, nSamples: nS, unknownTraces: centredGap(16), slopePairs: slopes, cancel: { cancelled: true } })).toThrow(CancelledError);
  });

  it('passes a gather with nothing to fill through unchanged', () => {
    const { u, slopes } = hyp();
    const r = solveLeastSquares({ data: u, nTraces: nT, nSamples: nS, unknownTraces: new Uint8Array(nT), slopePairs: slopes });
    expect(r.data).toEqual(u);
    expect(r.iterations).toBe(0);
  });
});

describe('least-squares objective and the hold-out iteration tracker', () => {
  // Finite-difference gradient check of J(x) = ||A x − b||² + ε²||x||² against 2(Aᵀ(Ax − b) + ε²x), the
  // gradient CGLS follows (A = masked destructor on one block).
  it('the gradient from the adjoint matches central differences', async () => {
    const { blockAdjoint, blockApply, blockRange } = await import('../../../../core/fill/masked-operator');
    const { buildPwdPlan } = await import('../../../../core/pwd/operator');
    const { Rng } = await import('../../../../core/rng');
    const rng = new Rng(21);
    const nT = 7, nS = 30, eps = 0.01;
    const sigma = new Float64Array((nT - 1) * nS).map(() => (rng.uniform() - 0.5) * 5);
    const plan = buildPwdPlan(sigma, nT, nS, { order: 2, split: true });
    const blk = blockRange(2, 4, nT);
    const nr = (blk.p1 - blk.p0) * nS, nv = 3 * nS;
    const b = new Float64Array(nr).map(() => rng.normal());
    const x = new Float64Array(nv).map(() => rng.normal());
    const J = (v: Float64Array) => {
      const r = blockApply(plan, new Float64Array(nr), v, blk);
      let s = 0;
      for (let i = 0; i < nr; i++) s += (r[i] - b[i]) ** 2;
      for (let i = 0; i < nv; i++) s += eps * eps * v[i] * v[i];
      return s;
    };
    const res = blockApply(plan, new Float64Array(nr), x, blk).map((v, i) => v - b[i]);
    const g = blockAdjoint(plan, new Float64Array(nv), res, blk).map((v, i) => 2 * (v + eps * eps * x[i]));
    const h = 1e-6;
    for (const i of [0, 17, 45, 61, 89]) {
      const xp = x.slice(), xm = x.slice();
      xp[i] += h;
      xm[i] -= h;
      const fd = (J(xp) - J(xm)) / (2 * h);
      expect(Math.abs(fd - g[i]) / Math.max(1, Math.abs(g[i]))).toBeLessThan(1e-6);
    }
  });

  it('the tracker records the hidden-trace error per iteration and picks the least', async () => {
    const { IterationTracker } = await import('../../../../core/fill/lsq');
    const { u, slopes } = hyp();
    const gap = centredGap(8);
    const d = u.slice();
    d.fill(0, 26 * nS, 34 * nS);
    const hidden = new Uint8Array(nT).fill(1, 26, 34);
    const tr = new IterationTracker(u, hidden);
    const r = solveLeastSquares({ data: d, nTraces: nT, nSamples: nS, unknownTraces: gap, slopePairs: slopes }, {}, tr);
    const best = tr.best(1000);
    // With exact slopes the error keeps falling, so the best count is the last one, and it equals the final fill's error.
    let e = 0;
    for (let x = 26; x < 34; x++) for (let t = 0; t < nS; t++) e += (r.data[x * nS + t] - u[x * nS + t]) ** 2;
    expect(best.error).toBeLessThanOrEqual(tr.errorAt(0));
    expect(tr.errorAt(r.iterations)).toBeCloseTo(e, 10);
    expect(best.error).toBeLessThanOrEqual(e * (1 + 1e-12));
  });
});
