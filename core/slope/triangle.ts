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

/** Radii up to this use direct taps (2r−1 weights (r − |d|)/r²) instead of running sums: fewer passes. */
const DIRECT_MAX_RADIUS = 4;

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
  if (r <= DIRECT_MAX_RADIUS && ns > 2 * r) return triangleTimeDirect(out, x, nCols, ns, r, scratch);
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
  if (r <= DIRECT_MAX_RADIUS) return triangleAcrossDirect(out, x, nCols, ns, r, scratch);
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

/** Direct-tap time smoothing for small radii; copies each column to scratch first so out may be x. */
function triangleTimeDirect(out: Float64Array, x: Float64Array, nCols: number, ns: number, r: number, scratch: Float64Array): Float64Array {
  const inv = 1 / (r * r);
  const col = scratch;
  for (let c = 0; c < nCols; c++) {
    const base = c * ns;
    for (let t = 0; t < ns; t++) col[t] = x[base + t];
    // edges: taps outside the trace are zero
    for (let t = 0; t < r - 1; t++) out[base + t] = edgeSum(col, t, ns, r) * inv;
    for (let t = ns - r + 1; t < ns; t++) out[base + t] = edgeSum(col, t, ns, r) * inv;
    if (r === 2) for (let t = 1; t < ns - 1; t++) out[base + t] = (col[t - 1] + 2 * col[t] + col[t + 1]) * inv;
    else if (r === 3) for (let t = 2; t < ns - 2; t++) out[base + t] = (col[t - 2] + col[t + 2] + 2 * (col[t - 1] + col[t + 1]) + 3 * col[t]) * inv;
    else for (let t = r - 1; t < ns - r + 1; t++) {
      let a = r * col[t];
      for (let d = 1; d < r; d++) a += (r - d) * (col[t - d] + col[t + d]);
      out[base + t] = a * inv;
    }
  }
  return out;
}

function edgeSum(col: Float64Array, t: number, ns: number, r: number): number {
  let a = 0;
  for (let d = -(r - 1); d <= r - 1; d++) {
    const k = t + d;
    if (k >= 0 && k < ns) a += (r - Math.abs(d)) * col[k];
  }
  return a;
}

/**
 * Direct-tap smoothing across columns for small radii, in one pass per output column. Columns already
 * overwritten are read from a ring of their original values in scratch (r columns), so out may be x.
 */
function triangleAcrossDirect(out: Float64Array, x: Float64Array, nCols: number, ns: number, r: number, scratch: Float64Array): Float64Array {
  const inv = 1 / (r * r);
  const ring = scratch;
  for (let c = 0; c < nCols; c++) {
    const o = c * ns;
    const slot = (c % r) * ns;
    for (let t = 0; t < ns; t++) ring[slot + t] = x[o + t];
    // source offsets: left neighbours from the ring, right neighbours still original in x; -1 = outside
    const w0 = r * inv;
    if (r === 2) {
      const l1 = c >= 1 ? ((c - 1) % r) * ns : -1;
      const r1 = c + 1 < nCols ? (c + 1) * ns : -1;
      const w1 = inv;
      if (l1 >= 0 && r1 >= 0) for (let t = 0; t < ns; t++) out[o + t] = w0 * ring[slot + t] + w1 * (ring[l1 + t] + x[r1 + t]);
      else if (l1 >= 0) for (let t = 0; t < ns; t++) out[o + t] = w0 * ring[slot + t] + w1 * ring[l1 + t];
      else if (r1 >= 0) for (let t = 0; t < ns; t++) out[o + t] = w0 * ring[slot + t] + w1 * x[r1 + t];
      else for (let t = 0; t < ns; t++) out[o + t] = w0 * ring[slot + t];
      continue;
    }
    if (r === 3 && c >= 2 && c + 2 < nCols) {
      const l1 = ((c - 1) % r) * ns, l2 = ((c - 2) % r) * ns, r1 = (c + 1) * ns, r2 = (c + 2) * ns;
      const w1 = 2 * inv, w2 = inv;
      for (let t = 0; t < ns; t++) out[o + t] = w0 * ring[slot + t] + w1 * (ring[l1 + t] + x[r1 + t]) + w2 * (ring[l2 + t] + x[r2 + t]);
      continue;
    }
    for (let t = 0; t < ns; t++) out[o + t] = w0 * ring[slot + t];
    for (let d = 1; d < r; d++) {
      const w = (r - d) * inv;
      if (c - d >= 0) {
        const a = ((c - d) % r) * ns;
        for (let t = 0; t < ns; t++) out[o + t] += w * ring[a + t];
      }
      if (c + d < nCols) {
        const b = (c + d) * ns;
        for (let t = 0; t < ns; t++) out[o + t] += w * x[b + t];
      }
    }
  }
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
