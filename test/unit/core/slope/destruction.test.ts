import { describe, expect, it } from 'vitest';
import { destructionResidualAndSlopeDerivativeUnchecked, destructionSideEnergyUnchecked } from '../../../../core/slope/destruction';
import { buildPwdPlan, pwdApply, pwdApplySlopeDerivative } from '../../../../core/pwd/operator';
import type { PwdOrder } from '../../../../core/pwd/maxflat';
import { addPlaneWave } from '../../../../core/synth/events';
import { Rng } from '../../../../core/rng';

function run(u: Float64Array, sigma: Float64Array, shift: Int32Array | null, nT: number, nS: number, order: PwdOrder, live?: Uint8Array) {
  const n = (nT - 1) * nS;
  const r = new Float64Array(n), g = new Float64Array(n), w = new Float64Array(n);
  destructionResidualAndSlopeDerivativeUnchecked(r, g, w, u, sigma, shift, live ?? new Uint8Array(nT - 1).fill(1), nT, nS, order);
  return { r, g, w };
}

describe('fused destruction residual and σ-derivative', () => {
  // Consistency with the tested operator in core/pwd (Fomel 2002 filters, methods.md §1.3–1.4).
  it.each([1, 2] as PwdOrder[])('equals pwdApply / pwdApplySlopeDerivative without shift (order %s)', (order) => {
    const rng = new Rng(order);
    const nT = 7, nS = 41;
    const u = new Float64Array(nT * nS).map(() => rng.normal());
    const sigma = new Float64Array((nT - 1) * nS).map(() => (rng.uniform() - 0.5) * 3);
    const plan = buildPwdPlan(sigma, nT, nS, { order, derivatives: true });
    const rRef = pwdApply(plan, new Float64Array(sigma.length), u);
    const gRef = pwdApplySlopeDerivative(plan, new Float64Array(sigma.length), u);
    const { r, g, w } = run(u, sigma, null, nT, nS, order);
    for (let i = 0; i < sigma.length; i++) {
      expect(r[i]).toBeCloseTo(rRef[i], 12);
      expect(g[i]).toBeCloseTo(gRef[i], 12);
      expect(w[i]).toBe(plan.valid[i]);
    }
  });

  // Exactness at integer slopes (methods.md §6.3): with a frozen integer shift n the filter sees f = σ − n, so
  // any waveform shifted by an integer slope well beyond 2N is destroyed to rounding.
  it('destroys noise traces shifted by 5 and −7 samples per trace with a frozen shift', () => {
    const rng = new Rng(9);
    const nT = 6, nS = 150;
    for (const s of [5, -7]) {
      const base = new Float64Array(nS + 20 * nT).map(() => rng.normal());
      const u = new Float64Array(nT * nS);
      for (let x = 0; x < nT; x++) for (let t = 0; t < nS; t++) u[x * nS + t] = base[t - s * x + 10 * nT];
      const sigma = new Float64Array((nT - 1) * nS).fill(s);
      const shift = new Int32Array(sigma.length).fill(s);
      const { r, w } = run(u, sigma, shift, nT, nS, 1);
      let e = 0, cnt = 0;
      for (let i = 0; i < r.length; i++) { e = Math.max(e, Math.abs(r[i])); cnt += w[i]; }
      expect(e).toBeLessThan(1e-13);
      expect(cnt).toBeGreaterThan(0.8 * r.length);
      // with the shift off by one, the residual is large
      const { r: r2 } = run(u, sigma, new Int32Array(sigma.length).fill(s + 1), nT, nS, 1);
      const far = run(u, new Float64Array(sigma.length).fill(s + 1), new Int32Array(sigma.length).fill(s + 1), nT, nS, 1).r;
      expect(Math.max(...r2.map(Math.abs))).toBeLessThan(1e-13); // shift s+1 with f = −1 is still exact (|f| ≤ 2N)
      expect(Math.max(...far.map(Math.abs))).toBeGreaterThan(0.1);
    }
  });

  // Finite-difference check of g = ∂r/∂σ (central differences, h = 1e-6), with and without shift.
  it.each([1, 2] as PwdOrder[])('g is the derivative of r in σ (finite differences, order %s)', (order) => {
    const rng = new Rng(20 + order);
    const nT = 5, nS = 60;
    const u = new Float64Array(nT * nS).map(() => rng.normal());
    const sigma = new Float64Array((nT - 1) * nS).map(() => 3 + rng.uniform());
    const shift = new Int32Array(sigma.length).fill(3);
    const h = 1e-6;
    const { g, w } = run(u, sigma, shift, nT, nS, order);
    const rp = run(u, sigma.map((v) => v + h), shift, nT, nS, order).r;
    const rm = run(u, sigma.map((v) => v - h), shift, nT, nS, order).r;
    for (let i = 0; i < sigma.length; i++) if (w[i]) expect(Math.abs((rp[i] - rm[i]) / (2 * h) - g[i])).toBeLessThan(1e-7 * (1 + Math.abs(g[i])));
  });

  it('pairs touching a missing trace carry no equation', () => {
    const nT = 4, nS = 20;
    const u = addPlaneWave(new Float64Array(nT * nS), nT, nS, { t0Samples: 8, slopeSamplesPerTrace: 0.5, fpCyclesPerSample: 0.1 });
    const live = Uint8Array.from([1, 0, 1]);
    const { r, w } = run(u, new Float64Array(3 * nS), null, nT, nS, 1, live);
    for (let t = 0; t < nS; t++) { expect(w[nS + t]).toBe(0); expect(r[nS + t]).toBe(0); }
    const e = new Float64Array(3 * nS);
    destructionSideEnergyUnchecked(e, u, new Float64Array(3 * nS), null, live, nT, nS, 1);
    expect(e.slice(nS, 2 * nS).every((v) => v === 0)).toBe(true);
  });
});
