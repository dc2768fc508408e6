/**
 * Maxflat (Thiran-type) all-pass coefficients for plane-wave destruction (Fomel 2002, Geophysics 67(6)).
 * B(Z) = Σ_{k=-N..N} b_k(σ) Z^k with B(Z)/B(1/Z) ≈ Z^σ. Closed form (methods.md §1.4):
 *   b_k(σ) = (2N)!² / ((4N)! (N+k)! (N−k)!) · Π_{j=N+k+1}^{2N} (j − σ) · Π_{j=N−k+1}^{2N} (j + σ)
 * N = 1 gives the 3-point filter, N = 2 the 5-point filter. σ is in samples per trace.
 */

export type PwdOrder = 1 | 2;

function factorial(n: number): number {
  let f = 1;
  for (let i = 2; i <= n; i++) f *= i;
  return f;
}

const NORM: Record<PwdOrder, Float64Array> = {
  1: normTable(1),
  2: normTable(2),
};

function normTable(n: number): Float64Array {
  const t = new Float64Array(2 * n + 1);
  const c = factorial(2 * n) ** 2 / factorial(4 * n);
  for (let k = -n; k <= n; k++) t[k + n] = c / (factorial(n + k) * factorial(n - k));
  return t;
}

/**
 * Writes b_{-N..N}(σ) into out[offset .. offset+2N]. Unchecked, allocation-free.
 * @returns out
 */
export function maxflatCoefficients(out: Float64Array, sigma: number, order: PwdOrder, offset = 0): Float64Array {
  const norm = NORM[order];
  const n = order;
  for (let k = -n; k <= n; k++) {
    let p = norm[k + n];
    for (let j = n + k + 1; j <= 2 * n; j++) p *= j - sigma;
    for (let j = n - k + 1; j <= 2 * n; j++) p *= j + sigma;
    out[offset + k + n] = p;
  }
  return out;
}

/**
 * Writes db_k/dσ for k = -N..N into out[offset ..]. Product rule over the linear factors. Unchecked.
 * @returns out
 */
export function maxflatDerivatives(out: Float64Array, sigma: number, order: PwdOrder, offset = 0): Float64Array {
  const norm = NORM[order];
  const n = order;
  for (let k = -n; k <= n; k++) {
    // Factors (a_i + s_i σ): (j − σ) for j in N+k+1..2N and (j + σ) for j in N−k+1..2N.
    let sum = 0;
    const nA = 2 * n - (n + k);
    const nB = 2 * n - (n - k);
    const total = nA + nB;
    for (let skip = 0; skip < total; skip++) {
      let p = 1;
      let idx = 0;
      let sign = 1;
      for (let j = n + k + 1; j <= 2 * n; j++, idx++) {
        if (idx === skip) sign = -1;
        else p *= j - sigma;
      }
      for (let j = n - k + 1; j <= 2 * n; j++, idx++) {
        if (idx === skip) sign = 1;
        else p *= j + sigma;
      }
      sum += sign * p;
    }
    out[offset + k + n] = norm[k + n] * sum;
  }
  return out;
}
