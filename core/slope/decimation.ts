/**
 * Regular decimation (methods.md §2.6, §3.4): live traces every k-th grid position. Slopes are estimated on the
 * coarse grid of live traces (σ_c, samples per coarse trace) and mapped to the fine grid as σ_f = σ_c / k,
 * interpolated linearly along x at each time row onto the fine pair positions p+½ (constant beyond the ends).
 * Coarse trace j sits at fine position phase + j·k; coarse pair j at phase + j·k + k/2.
 */

export interface CoarseGrid {
  readonly factor: number;
  readonly phase: number;
  /** Fine trace index of each coarse trace. */
  readonly fineIndex: Int32Array;
}

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return a;
}

/**
 * The decimation factor implied by the live mask: the greatest common divisor of the distances between live
 * traces, if all live traces sit on that lattice and it is > 1 with at least 3 live traces; else 1.
 */
export function detectDecimationFactor(traceLive: Uint8Array): number {
  let first = -1, prev = -1, g = 0, count = 0;
  for (let x = 0; x < traceLive.length; x++) {
    if (!traceLive[x]) continue;
    if (first < 0) first = x;
    else g = gcd(g, x - prev);
    prev = x;
    count++;
  }
  return count >= 3 && g > 1 ? g : 1;
}

/** The coarse grid of a decimated fine grid: every k-th trace from the first live one (fine phase = its index mod k). */
export function coarseGridOf(traceLive: Uint8Array, factor: number): CoarseGrid {
  let firstLive = 0;
  while (firstLive < traceLive.length && !traceLive[firstLive]) firstLive++;
  const phase = firstLive < traceLive.length ? firstLive % factor : 0;
  const n = Math.floor((traceLive.length - 1 - phase) / factor) + 1;
  const fineIndex = new Int32Array(n);
  for (let j = 0; j < n; j++) fineIndex[j] = phase + j * factor;
  return { factor, phase, fineIndex };
}

/** Copies the coarse traces out of the fine gather (trace-major). */
export function extractCoarse(u: ArrayLike<number>, nSamples: number, grid: CoarseGrid, traceLive: Uint8Array): { data: Float64Array; live: Uint8Array } {
  const n = grid.fineIndex.length;
  const data = new Float64Array(n * nSamples);
  const live = new Uint8Array(n);
  for (let j = 0; j < n; j++) {
    const x = grid.fineIndex[j];
    live[j] = traceLive[x];
    for (let t = 0; t < nSamples; t++) data[j * nSamples + t] = u[x * nSamples + t];
  }
  return { data, live };
}

/**
 * Maps a coarse pair-grid field to the fine pair grid: out[p] = scale · interp_x(coarse)(p + ½).
 * Use scale = 1/k for slopes, 1 for confidence. Unchecked. @returns out
 */
export function coarsePairsToFinePairs(out: Float64Array, coarse: Float64Array, grid: CoarseGrid, nFineTraces: number, nSamples: number, scale: number): Float64Array {
  const nc = grid.fineIndex.length - 1; // coarse pairs
  const k = grid.factor;
  for (let p = 0; p < nFineTraces - 1; p++) {
    const pos = (p + 0.5 - grid.phase - k / 2) / k; // fractional coarse pair index
    let j0: number, j1: number, f: number;
    if (nc <= 1 || pos <= 0) { j0 = 0; j1 = 0; f = 0; }
    else if (pos >= nc - 1) { j0 = nc - 1; j1 = nc - 1; f = 0; }
    else { j0 = Math.floor(pos); j1 = j0 + 1; f = pos - j0; }
    const o = p * nSamples, a = j0 * nSamples, b = j1 * nSamples;
    for (let t = 0; t < nSamples; t++) out[o + t] = scale * ((1 - f) * coarse[a + t] + f * coarse[b + t]);
  }
  return out;
}

/** Nearest fine pair index of coarse pair j (position phase + j·k + k/2), clamped to [0, nFinePairs−1]. */
export function finePairOfCoarsePair(grid: CoarseGrid, j: number, nFinePairs: number): number {
  const p = Math.round(grid.phase + j * grid.factor + grid.factor / 2 - 0.5);
  return p < 0 ? 0 : p >= nFinePairs ? nFinePairs - 1 : p;
}
