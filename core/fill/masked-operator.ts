/**
 * The plane-wave destructor restricted to one block of unknown traces (methods.md §3.1): A = C(σ)·M, where M
 * injects the samples of traces a..b into an otherwise zero gather, and only the pairs that touch those traces
 * (pairs a−1..b, clipped to the gather) are kept. Blocks separated by a known trace share no unknown in any
 * pair, so each block is an independent least-squares problem.
 *
 * Layouts: `v` holds traces a..b trace-major, v[(x−a)·nSamples + t]; `r` holds pairs p0..p1−1 pair-major,
 * r[(p−p0)·nSamples + t]. Coefficients come from a PwdPlan of the whole gather (core/pwd/operator.ts).
 * Unchecked, allocation-free.
 */
import type { PwdPlan } from '../pwd/operator';

export interface BlockRange {
  /** First and last unknown trace (inclusive). */
  readonly a: number;
  readonly b: number;
  /** Pairs p0..p1−1 that touch the block. */
  readonly p0: number;
  readonly p1: number;
}

export function blockRange(a: number, b: number, nTraces: number): BlockRange {
  return { a, b, p0: Math.max(0, a - 1), p1: Math.min(nTraces - 1, b + 1) };
}

/** r = C M v on the block's pairs. @returns r */
export function blockApply(plan: PwdPlan, r: Float64Array, v: Float64Array, blk: BlockRange): Float64Array {
  const { order: n, nSamples: nS, coef, shift, valid } = plan;
  const w = 2 * n + 1;
  const { a, b, p0, p1 } = blk;
  for (let p = p0; p < p1; p++) {
    const leftIn = p >= a;
    const rightIn = p + 1 <= b;
    const lbase = (p - a) * nS;
    const rbase = (p + 1 - a) * nS;
    const obase = (p - p0) * nS;
    for (let t = 0; t < nS; t++) {
      const i = p * nS + t;
      if (valid[i] === 0) {
        r[obase + t] = 0;
        continue;
      }
      const c = i * w + n;
      let acc = 0;
      if (rightIn) {
        const rt = rbase + t + shift[i];
        for (let k = -n; k <= n; k++) acc += coef[c + k] * v[rt + k];
      }
      if (leftIn) {
        const lt = lbase + t;
        for (let k = -n; k <= n; k++) acc -= coef[c + k] * v[lt - k];
      }
      r[obase + t] = acc;
    }
  }
  return r;
}

/** v = Mᵀ Cᵀ r (exact adjoint of blockApply; overwrites v). @returns v */
export function blockAdjoint(plan: PwdPlan, v: Float64Array, r: Float64Array, blk: BlockRange): Float64Array {
  const { order: n, nSamples: nS, coef, shift, valid } = plan;
  const w = 2 * n + 1;
  const { a, b, p0, p1 } = blk;
  v.fill(0, 0, (b - a + 1) * nS);
  for (let p = p0; p < p1; p++) {
    const leftIn = p >= a;
    const rightIn = p + 1 <= b;
    const lbase = (p - a) * nS;
    const rbase = (p + 1 - a) * nS;
    const obase = (p - p0) * nS;
    for (let t = 0; t < nS; t++) {
      const i = p * nS + t;
      if (valid[i] === 0) continue;
      const ri = r[obase + t];
      if (ri === 0) continue;
      const c = i * w + n;
      if (rightIn) {
        const rt = rbase + t + shift[i];
        for (let k = -n; k <= n; k++) v[rt + k] += coef[c + k] * ri;
      }
      if (leftIn) {
        const lt = lbase + t;
        for (let k = -n; k <= n; k++) v[lt - k] -= coef[c + k] * ri;
      }
    }
  }
  return v;
}

/** r = C u on the block's pairs, u the whole gather (trace-major). @returns r */
export function blockResidual(plan: PwdPlan, r: Float64Array, u: Float64Array, blk: BlockRange): Float64Array {
  const { order: n, nSamples: nS, coef, shift, valid } = plan;
  const w = 2 * n + 1;
  for (let p = blk.p0; p < blk.p1; p++) {
    const obase = (p - blk.p0) * nS;
    for (let t = 0; t < nS; t++) {
      const i = p * nS + t;
      if (valid[i] === 0) {
        r[obase + t] = 0;
        continue;
      }
      const c = i * w + n;
      const rt = i + nS + shift[i];
      let acc = 0;
      for (let k = -n; k <= n; k++) acc += coef[c + k] * (u[rt + k] - u[i - k]);
      r[obase + t] = acc;
    }
  }
  return r;
}
