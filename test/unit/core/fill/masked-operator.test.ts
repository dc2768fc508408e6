import { describe, expect, it } from 'vitest';
import { blockAdjoint, blockApply, blockRange, blockResidual } from '../../../../core/fill/masked-operator';
import { buildPwdPlan, pwdApply } from '../../../../core/pwd/operator';
import type { PwdOrder } from '../../../../core/pwd/maxflat';
import { Rng } from '../../../../core/rng';

const dot = (a: Float64Array, b: Float64Array) => a.reduce((s, v, i) => s + v * b[i], 0);

describe('masked plane-wave destructor A = C·M on one block', () => {
  // Dot-product test (methods.md §6.5: relative mismatch < 1e-12 in Float64).
  it('dot-product test <A v, r> = <v, Aᵀ r> at interior and edge blocks, both orders', () => {
    const rng = new Rng(11);
    const nT = 12, nS = 41;
    for (const order of [1, 2] as PwdOrder[]) {
      const sigma = new Float64Array((nT - 1) * nS).map(() => (rng.uniform() - 0.5) * 6);
      const plan = buildPwdPlan(sigma, nT, nS, { order, split: true });
      for (const [a, b] of [[0, 2], [4, 7], [9, 11], [5, 5], [0, 11]]) {
        const blk = blockRange(a, b, nT);
        const v = new Float64Array((b - a + 1) * nS).map(() => rng.normal());
        const r = new Float64Array((blk.p1 - blk.p0) * nS).map(() => rng.normal());
        const av = blockApply(plan, new Float64Array(r.length), v, blk);
        const atr = blockAdjoint(plan, new Float64Array(v.length), r, blk);
        const x = dot(av, r), y = dot(v, atr);
        expect(Math.abs(x - y) / Math.max(Math.abs(x), Math.abs(y))).toBeLessThan(1e-12);
      }
    }
  });

  it('equals the whole-gather destructor applied to the block injected into zeros, and the residual to C u', () => {
    const rng = new Rng(12);
    const nT = 9, nS = 30;
    const sigma = new Float64Array((nT - 1) * nS).map(() => (rng.uniform() - 0.5) * 4);
    const plan = buildPwdPlan(sigma, nT, nS, { order: 2, split: true });
    const blk = blockRange(3, 5, nT);
    const v = new Float64Array(3 * nS).map(() => rng.normal());
    const z = new Float64Array(nT * nS);
    z.set(v, 3 * nS);
    const full = pwdApply(plan, new Float64Array((nT - 1) * nS), z);
    const part = blockApply(plan, new Float64Array((blk.p1 - blk.p0) * nS), v, blk);
    for (let i = 0; i < part.length; i++) expect(part[i]).toBeCloseTo(full[blk.p0 * nS + i], 14);
    const u = new Float64Array(nT * nS).map(() => rng.normal());
    const cu = pwdApply(plan, new Float64Array((nT - 1) * nS), u);
    const res = blockResidual(plan, new Float64Array(part.length), u, blk);
    for (let i = 0; i < res.length; i++) expect(res[i]).toBeCloseTo(cu[blk.p0 * nS + i], 14);
  });
});
