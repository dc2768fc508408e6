import { describe, expect, it } from 'vitest';
import { centredToSplitSlopes } from '../../../../core/slope/split-convention';
import { buildPwdPlan, pwdApply } from '../../../../core/pwd/operator';
import { destructionResidualAndSlopeDerivativeUnchecked } from '../../../../core/slope/destruction';
import { addHyperbola, type HyperbolaSpec } from '../../../../core/synth/events';

describe('centred slopes → split-operator convention', () => {
  // Steep NMO hyperbolas (methods.md §6.6 with v = 0.2 traces/sample: slopes up to ~4 samples per trace). The
  // exact centred slope field, resampled to the split operator's stencil centre, must destroy the data better
  // than the same field used as is, with the tested operator of core/pwd (integer+fraction split).
  it('lowers the split destruction residual of exact slopes on steep curved events', () => {
    const nT = 40, nS = 500;
    const events: HyperbolaSpec[] = [120, 220, 320].map((t0) => ({ t0Samples: t0, velocityTracesPerSample: 0.2, apexTrace: 0, fpCyclesPerSample: 0.05 }));
    const u = new Float64Array(nT * nS);
    for (const e of events) addHyperbola(u, nT, nS, e);
    // The moveout field of this hyperbola family, σ(x, t) = x/(v² t) at every point (methods.md §6.6), at the pair
    // midpoints: smooth in t, so the time at which it is read matters.
    const centred = new Float64Array((nT - 1) * nS);
    for (let p = 0; p < nT - 1; p++) for (let t = 0; t < nS; t++) centred[p * nS + t] = (p + 0.5) / (0.04 * Math.max(t, 20));
    const energy = (sig: Float64Array) => {
      const plan = buildPwdPlan(sig, nT, nS, { split: true });
      const r = pwdApply(plan, new Float64Array(sig.length), u);
      let e = 0;
      for (let p = 10; p < nT - 1; p++) for (let t = 100; t < 470; t++) e += r[p * nS + t] ** 2;
      return e;
    };
    const converted = centredToSplitSlopes(centred, nT, nS);
    expect(Math.max(...centred)).toBeGreaterThan(3);
    // measured: 4.4e-4 against 5.3e-4 of the data energy (v = 0.2)
    expect(energy(converted)).toBeLessThan(0.9 * energy(centred));
    // and it equals the residual of the centred split stencil of core/slope/destruction.ts fed the centred field
    const n = centred.length;
    const r = new Float64Array(n), g = new Float64Array(n), w = new Float64Array(n);
    destructionResidualAndSlopeDerivativeUnchecked(r, g, w, u, centred, Int32Array.from(centred, (v) => Math.round(v)), new Uint8Array(nT - 1).fill(1), nT, nS, 1);
    let e = 0;
    for (let p = 10; p < nT - 1; p++) for (let t = 100; t < 470; t++) e += r[p * nS + t] ** 2;
    expect(Math.abs(e - energy(converted)) / e).toBeLessThan(0.02);
  });

  it('leaves gentle slopes (|σ| < ½) unchanged and constant fields unchanged', () => {
    const s = Float64Array.from({ length: 3 * 20 }, (_, i) => 0.3 * Math.sin(i));
    expect(Array.from(centredToSplitSlopes(s, 4, 20))).toEqual(Array.from(s));
    const c = new Float64Array(3 * 20).fill(3.7);
    expect(Array.from(centredToSplitSlopes(c, 4, 20))).toEqual(Array.from(c));
  });
});
