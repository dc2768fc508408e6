import { describe, expect, it } from 'vitest';
import { buildPwdPlan, pwdAdjoint, pwdApply, pwdApplySlopeDerivative } from '../../../../core/pwd/operator';
import type { PwdOrder } from '../../../../core/pwd/maxflat';
import { Rng } from '../../../../core/rng';

const ricker = (t: number, fp: number) => {
  const a = (Math.PI * fp * t) ** 2;
  return (1 - 2 * a) * Math.exp(-a);
};

function planeWave(nTraces: number, nSamples: number, sigma: number, fp: number, t0: number): Float64Array {
  const u = new Float64Array(nTraces * nSamples);
  for (let x = 0; x < nTraces; x++) for (let t = 0; t < nSamples; t++) u[x * nSamples + t] = ricker(t - t0 - sigma * x, fp);
  return u;
}

const norm = (a: Float64Array) => Math.sqrt(a.reduce((s, v) => s + v * v, 0));
const dot = (a: Float64Array, b: Float64Array) => a.reduce((s, v, i) => s + v * b[i], 0);

describe('plane-wave destruction operator', () => {
  it('dot-product test: <C u, r> = <u, Cᵀ r> to 1e-12, both orders, with and without integer split', () => {
    const rng = new Rng(3);
    const nT = 13, nS = 57;
    for (const order of [1, 2] as PwdOrder[]) {
      for (const split of [false, true]) {
        const sigma = new Float64Array((nT - 1) * nS).map(() => (rng.uniform() - 0.5) * 7);
        const plan = buildPwdPlan(sigma, nT, nS, { order, split });
        const u = new Float64Array(nT * nS).map(() => rng.normal());
        const r = new Float64Array((nT - 1) * nS).map(() => rng.normal());
        const cu = pwdApply(plan, new Float64Array(r.length), u);
        const ctr = pwdAdjoint(plan, new Float64Array(u.length), r);
        const a = dot(cu, r), b = dot(u, ctr);
        expect(Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b))).toBeLessThan(1e-12);
      }
    }
  });

  // Exactness at integer slopes |σ| ≤ 2N for any sampled waveform (methods.md §1.5, §6.3).
  it('destroys random noise traces shifted by integer slopes |σ| ≤ 2N to rounding; wrong sign leaves a large residual', () => {
    const rng = new Rng(5);
    const nT = 8, nS = 120;
    for (const order of [1, 2] as PwdOrder[]) {
      for (let s = -2 * order; s <= 2 * order; s++) {
        const base = new Float64Array(nS + 20 * nT).map(() => rng.normal());
        const u = new Float64Array(nT * nS);
        for (let x = 0; x < nT; x++) for (let t = 0; t < nS; t++) u[x * nS + t] = base[t - s * x + 10 * nT];
        const plan = buildPwdPlan(new Float64Array((nT - 1) * nS).fill(s), nT, nS, { order });
        const r = pwdApply(plan, new Float64Array((nT - 1) * nS), u);
        expect(norm(r) / norm(u)).toBeLessThan(1e-14);
        if (s !== 0) {
          const wrong = buildPwdPlan(new Float64Array((nT - 1) * nS).fill(-s), nT, nS, { order });
          expect(norm(pwdApply(wrong, new Float64Array((nT - 1) * nS), u)) / norm(u)).toBeGreaterThan(0.1);
        }
      }
    }
  });

  // Upper bounds from methods.md §6.3 (×2 tolerance as suggested there), interior rows.
  it.each([
    [1, 0.3, 0.1, 9.0e-4],
    [1, 0.5, 0.1, 1.2e-3],
    [1, 0.5, 0.05, 3.9e-5],
    [1, 1.5, 0.1, 2.6e-3],
    [2, 0.5, 0.1, 1.25e-5],
  ] as [PwdOrder, number, number, number][])('order %s, σ = %s, f_p = %s: ||r||/||u|| below 2 × %s', (order, s, fp, bound) => {
    const nT = 16, nS = 200;
    const u = planeWave(nT, nS, s, fp, 60);
    const plan = buildPwdPlan(new Float64Array((nT - 1) * nS).fill(s), nT, nS, { order });
    const r = pwdApply(plan, new Float64Array((nT - 1) * nS), u);
    const ratio = norm(r) / norm(u);
    expect(ratio).toBeLessThan(2 * bound);
    expect(ratio).toBeGreaterThan(bound / 20); // not trivially zero: the filter is approximate here
  });

  it('integer split keeps steep fractional slopes accurate (σ = 3.3, 5.6 with the 3-point filter)', () => {
    for (const s of [3.3, 5.6, -4.4]) {
      const nT = 16, nS = 300;
      const u = planeWave(nT, nS, s, 0.08, 150 - 5 * s);
      const plan = buildPwdPlan(new Float64Array((nT - 1) * nS).fill(s), nT, nS, { order: 1, split: true });
      const r = pwdApply(plan, new Float64Array((nT - 1) * nS), u);
      expect(norm(r) / norm(u)).toBeLessThan(2e-3);
    }
  });

  it('slope derivative matches central differences of the operator output', () => {
    const rng = new Rng(9);
    const nT = 6, nS = 40;
    for (const order of [1, 2] as PwdOrder[]) {
      const sigma = new Float64Array((nT - 1) * nS).map(() => (rng.uniform() - 0.5) * 3);
      const u = new Float64Array(nT * nS).map(() => rng.normal());
      const plan = buildPwdPlan(sigma, nT, nS, { order, derivatives: true });
      const g = pwdApplySlopeDerivative(plan, new Float64Array(sigma.length), u);
      const h = 1e-6;
      const up = pwdApply(buildPwdPlan(sigma.map((v) => v + h), nT, nS, { order }), new Float64Array(sigma.length), u);
      const dn = pwdApply(buildPwdPlan(sigma.map((v) => v - h), nT, nS, { order }), new Float64Array(sigma.length), u);
      for (let i = 0; i < g.length; i++) expect(Math.abs(g[i] - (up[i] - dn[i]) / (2 * h))).toBeLessThan(1e-7 * Math.max(1, Math.abs(g[i])));
    }
  });
});
