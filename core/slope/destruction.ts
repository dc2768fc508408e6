/**
 * Fused plane-wave destruction residual and its σ-derivative for slope estimation (Fomel 2002; methods.md
 * §1.3–1.4, §2.1). Same filter as core/pwd/operator.ts, evaluated inline (no plan allocation per Gauss-Newton
 * step) and with an optional FROZEN integer shift per pair sample for steep slopes:
 *   σ = n + f,  nL = floor(n/2), nR = n − nL,
 *   r[p,t] = Σ_k b_k(f) (u[p+1, t+nR+k] − u[p, t−nL−k]),   g[p,t] = Σ_k b'_k(f) (same differences).
 * The integer part is split symmetrically between the two traces so the stencil stays centred at (p+½, t)
 * (half a sample late for odd n). Because n is held fixed during an estimation, r is smooth in σ: the
 * discontinuity of a per-call rounding split at f = ±½ (methods.md §1.5) never enters Gauss-Newton.
 * Layout: u trace-major (core/grid/gather.ts); r, g, sigma, shift and weights on the pair grid
 * (core/slope/pair-grid.ts).
 */
import type { PwdOrder } from '../pwd/maxflat';

/**
 * Writes r and g for every pair sample; w[i] = pairLive[p] where the whole stencil fits in both traces, else 0
 * (r = g = 0 there). shift may be null (all zero). Unchecked, allocation-free.
 */
export function destructionResidualAndSlopeDerivativeUnchecked(
  outR: Float64Array, outG: Float64Array, outW: Float64Array,
  u: ArrayLike<number>, sigma: Float64Array, shift: Int32Array | null, pairLive: Uint8Array,
  nTraces: number, nSamples: number, order: PwdOrder,
): void {
  const ns = nSamples;
  const N = order;
  for (let p = 0; p < nTraces - 1; p++) {
    const L = p * ns;
    const R = L + ns;
    const live = pairLive[p];
    for (let t = 0; t < ns; t++) {
      const i = L + t;
      const n = shift ? shift[i] : 0;
      const nL = Math.floor(n / 2);
      const nR = n - nL;
      const tl = t - nL;
      const tr = t + nR;
      if (live === 0 || tl - N < 0 || tl + N >= ns || tr - N < 0 || tr + N >= ns) {
        outR[i] = 0; outG[i] = 0; outW[i] = 0;
        continue;
      }
      const s = sigma[i] - n;
      if (N === 1) {
        const dm = u[R + tr - 1] - u[L + tl + 1];
        const d0 = u[R + tr] - u[L + tl];
        const dp = u[R + tr + 1] - u[L + tl - 1];
        const bm = ((1 - s) * (2 - s)) / 12, b0 = ((2 - s) * (2 + s)) / 6, bp = ((1 + s) * (2 + s)) / 12;
        outR[i] = bm * dm + b0 * d0 + bp * dp;
        outG[i] = ((2 * s - 3) / 12) * dm - (s / 3) * d0 + ((2 * s + 3) / 12) * dp;
      } else {
        const dm2 = u[R + tr - 2] - u[L + tl + 2];
        const dm1 = u[R + tr - 1] - u[L + tl + 1];
        const d0 = u[R + tr] - u[L + tl];
        const dp1 = u[R + tr + 1] - u[L + tl - 1];
        const dp2 = u[R + tr + 2] - u[L + tl - 2];
        const s2 = s * s;
        const bm2 = ((1 - s) * (2 - s) * (3 - s) * (4 - s)) / 1680;
        const bm1 = ((4 - s) * (3 - s) * (2 - s) * (4 + s)) / 420;
        const b0 = ((4 - s) * (3 - s) * (3 + s) * (4 + s)) / 280;
        const bp1 = ((4 - s) * (2 + s) * (3 + s) * (4 + s)) / 420;
        const bp2 = ((1 + s) * (2 + s) * (3 + s) * (4 + s)) / 1680;
        outR[i] = bm2 * dm2 + bm1 * dm1 + b0 * d0 + bp1 * dp1 + bp2 * dp2;
        const gm2 = ((2 * s - 5) * (s2 - 5 * s + 5)) / 840;
        const gm1 = -(4 * s2 * s - 15 * s2 - 20 * s + 80) / 420;
        const g0 = (s * (2 * s2 - 25)) / 140;
        const gp1 = -(4 * s2 * s + 15 * s2 - 20 * s - 80) / 420;
        const gp2 = ((2 * s + 5) * (s2 + 5 * s + 5)) / 840;
        outG[i] = gm2 * dm2 + gm1 * dm1 + g0 * d0 + gp1 * dp1 + gp2 * dp2;
      }
      outW[i] = 1;
    }
  }
}

/**
 * Energy of the two filtered sides, e = (Σ b_k u[p+1, t+nR+k])² + (Σ b_k u[p, t−nL−k])², the natural scale of
 * r² (for incoherent traces E[r²] ≈ E[e]). Where the stencil does not fit, 0. Unchecked.
 */
export function destructionSideEnergyUnchecked(
  out: Float64Array, u: ArrayLike<number>, sigma: Float64Array, shift: Int32Array | null, pairLive: Uint8Array,
  nTraces: number, nSamples: number, order: PwdOrder,
): void {
  const ns = nSamples;
  const N = order;
  const b = new Float64Array(5);
  for (let p = 0; p < nTraces - 1; p++) {
    const L = p * ns;
    const R = L + ns;
    for (let t = 0; t < ns; t++) {
      const i = L + t;
      const n = shift ? shift[i] : 0;
      const nL = Math.floor(n / 2);
      const tl = t - nL, tr = t + n - nL;
      if (pairLive[p] === 0 || tl - N < 0 || tl + N >= ns || tr - N < 0 || tr + N >= ns) {
        out[i] = 0;
        continue;
      }
      const s = sigma[i] - n;
      if (N === 1) {
        b[0] = ((1 - s) * (2 - s)) / 12; b[1] = ((2 - s) * (2 + s)) / 6; b[2] = ((1 + s) * (2 + s)) / 12;
      } else {
        b[0] = ((1 - s) * (2 - s) * (3 - s) * (4 - s)) / 1680;
        b[1] = ((4 - s) * (3 - s) * (2 - s) * (4 + s)) / 420;
        b[2] = ((4 - s) * (3 - s) * (3 + s) * (4 + s)) / 280;
        b[3] = ((4 - s) * (2 + s) * (3 + s) * (4 + s)) / 420;
        b[4] = ((1 + s) * (2 + s) * (3 + s) * (4 + s)) / 1680;
      }
      let a = 0, c = 0;
      for (let k = -N; k <= N; k++) {
        a += b[k + N] * u[R + tr + k];
        c += b[k + N] * u[L + tl - k];
      }
      out[i] = a * a + c * c;
    }
  }
}
