/**
 * Slopes for the integer+fraction ("split") destruction operator of core/pwd/operator.ts.
 * Dipweave's slope field is centred: slopePairs[p, t] is the slope of the event that crosses the pair position
 * p+½ at time t (the unsplit operator compares both traces around t). With `split` on, the operator compares
 * trace p around t with trace p+1 around t+n (n = round(σ)), so its stencil is centred at time t + n/2: it
 * needs the slope of the event crossing p+½ at t + n/2. For steep, curved events the two differ by
 * (n/2)·∂σ/∂t (e.g. 0.04 samples per trace for σ = 4 on a hyperbola at t = 200 samples), which costs a fill
 * several dB (methods.md §3.3). This map resamples the centred field to the split operator's convention:
 *   out[p, t] = σ(p, t + round(out)/2), solved by a short fixed-point iteration, linear interpolation in t.
 * Layout: pair grid (core/slope/pair-grid.ts). Unchecked; out must not alias sigma. @returns out
 */
export function centredToSplitSlopesUnchecked(out: Float64Array, sigma: Float64Array, nTraces: number, nSamples: number): Float64Array {
  const ns = nSamples;
  for (let p = 0; p < nTraces - 1; p++) {
    const b = p * ns;
    for (let t = 0; t < ns; t++) {
      let s = sigma[b + t];
      for (let it = 0; it < 3; it++) {
        const n = Math.round(s);
        if (n === 0) break;
        let tc = t + n / 2;
        if (tc < 0) tc = 0;
        else if (tc > ns - 1) tc = ns - 1;
        const j = Math.min(ns - 2, Math.floor(tc));
        const f = tc - j;
        const next = ns < 2 ? sigma[b] : sigma[b + j] * (1 - f) + sigma[b + j + 1] * f;
        if (Math.round(next) === n) {
          s = next;
          break;
        }
        s = next;
      }
      out[b + t] = s;
    }
  }
  return out;
}

/** Checked, allocating wrapper. */
export function centredToSplitSlopes(sigma: Float64Array, nTraces: number, nSamples: number): Float64Array {
  if (nTraces < 2 || sigma.length !== (nTraces - 1) * nSamples)
    throw new RangeError(`centredToSplitSlopes: length ${sigma.length} ≠ (nTraces−1)*nSamples = ${(nTraces - 1) * nSamples}`);
  return centredToSplitSlopesUnchecked(new Float64Array(sigma.length), sigma, nTraces, nSamples);
}
