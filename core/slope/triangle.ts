/**
 * Triangle smoothing (Claerbout 1992; used for shaping regularisation by Fomel 2007, Geophysics 72(2) R29).
 * Along one axis of length N, T = BᵀB / r², with B the causal box of length r mapping N samples to the N+r−1
 * samples of the full convolution (zero padding). T is symmetric (its own exact adjoint, boundaries included),
 * its impulse response is a triangle of half-width r−1 with peak 1/r, and ‖T‖ ≤ 1. Running sums make it O(1)
 * per sample whatever r. Radius 1 is the identity.
 *
 * Layout: a field of nCols columns × nSamples (column-major like the gather, field[c * nSamples + t]).
 * "time" smooths down each column; "across" smooths along rows, across columns.
 */

/** Scratch length needed by triangleTimeUnchecked. */
export function triangleTimeScratchLength(nSamples: number, radius: number): number {
  return nSamples + radius;
}

/** Scratch length needed by triangleAcrossUnchecked. */
export function triangleAcrossScratchLength(nCols: number, nSamples: number, radius: number): number {
  return (nCols + radius) * nSamples;
}

/**
 * Smooth every column along time with radius r (integer ≥ 1). out may be x. Unchecked, allocation-free.
 * @param scratch length ≥ nSamples + r
 * @returns out
 */
export function triangleTimeUnchecked(out: Float64Array, x: Float64Array, nCols: number, nSamples: number, radius: number, scratch: Float64Array): Float64Array {
  const r = radius;
  if (r <= 1) {
    if (out !== x) out.set(x.subarray(0, nCols * nSamples));
    return out;
  }
  const inv = 1 / (r * r);
  const ns = nSamples;
  const nFull = ns + r - 1;
  const y = scratch;
  for (let c = 0; c < nCols; c++) {
    const base = c * ns;
    // y = B x: full causal box sums (three stretches so the loops carry no branches)
    let acc = 0;
    const e1 = Math.min(r, ns);
    let j = 0;
    for (; j < e1; j++) { acc += x[base + j]; y[j] = acc; }
    for (; j < ns; j++) { acc += x[base + j] - x[base + j - r]; y[j] = acc; }
    for (; j < nFull; j++) { if (j - r >= 0) acc -= x[base + j - r]; y[j] = acc; }
    // out = Bᵀ y / r²
    acc = 0;
    for (let k = 0; k < r; k++) acc += y[k];
    out[base] = acc * inv;
    for (let i = 1; i < ns; i++) {
      acc += y[i + r - 1] - y[i - 1];
      out[base + i] = acc * inv;
    }
  }
  return out;
}

/**
 * Smooth across columns (along each time row) with radius r. Works on whole columns at once for cache
 * locality. out may be x. Unchecked, allocation-free.
 * @param scratch length ≥ (nCols + r) * nSamples
 * @returns out
 */
export function triangleAcrossUnchecked(out: Float64Array, x: Float64Array, nCols: number, nSamples: number, radius: number, scratch: Float64Array): Float64Array {
  const r = radius;
  const ns = nSamples;
  if (r <= 1) {
    if (out !== x) out.set(x.subarray(0, nCols * ns));
    return out;
  }
  const inv = 1 / (r * r);
  const nFull = nCols + r - 1;
  const y = scratch;
  // y row j = y row j−1 + x col j − x col j−r
  for (let j = 0; j < nFull; j++) {
    const yj = j * ns;
    const hasPrev = j > 0;
    const add = j < nCols;
    const sub = j - r >= 0 && j - r < nCols;
    const yp = (j - 1) * ns, xa = j * ns, xs = (j - r) * ns;
    if (hasPrev && add && sub) for (let t = 0; t < ns; t++) y[yj + t] = y[yp + t] + x[xa + t] - x[xs + t];
    else if (hasPrev && add) for (let t = 0; t < ns; t++) y[yj + t] = y[yp + t] + x[xa + t];
    else if (hasPrev && sub) for (let t = 0; t < ns; t++) y[yj + t] = y[yp + t] - x[xs + t];
    else if (hasPrev) for (let t = 0; t < ns; t++) y[yj + t] = y[yp + t];
    else for (let t = 0; t < ns; t++) y[yj + t] = x[xa + t];
  }
  // out col 0 = Σ_{j<r} y_j; out col i = out col i−1 + (y_{i+r−1} − y_{i−1}) (scaled by 1/r²)
  for (let t = 0; t < ns; t++) out[t] = y[t];
  for (let j = 1; j < r; j++) {
    const yj = j * ns;
    for (let t = 0; t < ns; t++) out[t] += y[yj + t];
  }
  for (let i = 1; i < nCols; i++) {
    const o = i * ns, op = o - ns, ya = (i + r - 1) * ns, ys = (i - 1) * ns;
    for (let t = 0; t < ns; t++) out[o + t] = out[op + t] + y[ya + t] - y[ys + t];
  }
  const n = nCols * ns;
  for (let i = 0; i < n; i++) out[i] *= inv;
  return out;
}

export interface Triangle2D {
  readonly nCols: number;
  readonly nSamples: number;
  readonly radiusTime: number;
  readonly radiusAcross: number;
  readonly scratch: Float64Array;
}

export function createTriangle2D(nCols: number, nSamples: number, radiusTime: number, radiusAcross: number): Triangle2D {
  for (const [name, v] of [['radiusTime', radiusTime], ['radiusAcross', radiusAcross]] as const)
    if (!Number.isInteger(v) || v < 1) throw new RangeError(`triangle smoothing: ${name} must be an integer ≥ 1. Value: ${v}`);
  const len = Math.max(triangleTimeScratchLength(nSamples, radiusTime), triangleAcrossScratchLength(nCols, nSamples, radiusAcross));
  return { nCols, nSamples, radiusTime, radiusAcross, scratch: new Float64Array(len) };
}

/** Separable 2-D triangle smoothing (time then across). Symmetric, so it is its own adjoint. out may be x. @returns out */
export function triangle2DApply(s: Triangle2D, out: Float64Array, x: Float64Array): Float64Array {
  triangleTimeUnchecked(out, x, s.nCols, s.nSamples, s.radiusTime, s.scratch);
  return triangleAcrossUnchecked(out, out, s.nCols, s.nSamples, s.radiusAcross, s.scratch);
}
