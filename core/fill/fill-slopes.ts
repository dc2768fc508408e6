/**
 * Slopes for a fill. On a regularly decimated gather the recorded traces alone are aliased, so the slope is
 * estimated on the coarse grid of recorded traces, low-passed below the aliasing frequency, divided by the
 * factor k and interpolated along x onto the fine pairs (methods.md §2.6 and §3.4; low-pass dip estimation:
 * Gan, Wang, Chen, Zhang & Jin 2015, IEEE GRSL 12(10)). Otherwise the estimator runs on the fine grid with the
 * traces to fill masked out.
 *
 * Layout: trace-major gathers; slopes on the pair grid (core/pwd/operator.ts), samples per trace.
 */
import type { CancelToken } from '../problems';

/** Any slope estimator: returns slopes on the pair grid, length (nTraces−1)·nSamples. */
export type SlopeEstimator = (data: Float64Array, nTraces: number, nSamples: number, liveTraces: Uint8Array, cancel?: CancelToken) => Float64Array;

/** RMS frequency of the live traces in cycles per sample, from derivative energy: sqrt(Σu'²/Σu²)/(2π). */
export function rmsFrequency(data: Float64Array, nTraces: number, nSamples: number, live: ArrayLike<number>): number {
  let e = 0;
  let de = 0;
  for (let x = 0; x < nTraces; x++) {
    if (!live[x]) continue;
    const base = x * nSamples;
    for (let t = 1; t < nSamples - 1; t++) {
      const v = data[base + t];
      const d = (data[base + t + 1] - data[base + t - 1]) / 2;
      e += v * v;
      de += d * d;
    }
  }
  if (e === 0) return 0;
  // The central difference responds as sin(ω): invert it for the frequency.
  return Math.asin(Math.min(1, Math.sqrt(de / e))) / (2 * Math.PI);
}

/**
 * Zero-phase low-pass of every trace: windowed-sinc FIR (Hann window, half-length ⌈2/fc⌉ samples), cutoff
 * fc cycles per sample, unit gain at zero frequency. Writes into out (may not alias data). @returns out
 */
export function lowPassTraces(out: Float64Array, data: Float64Array, nTraces: number, nSamples: number, fcCyclesPerSample: number): Float64Array {
  const half = Math.min(nSamples, Math.ceil(2 / fcCyclesPerSample));
  const h = new Float64Array(2 * half + 1);
  let sum = 0;
  for (let j = -half; j <= half; j++) {
    const s = j === 0 ? 2 * fcCyclesPerSample : Math.sin(2 * Math.PI * fcCyclesPerSample * j) / (Math.PI * j);
    const w = 0.5 + 0.5 * Math.cos((Math.PI * j) / (half + 1));
    h[j + half] = s * w;
    sum += s * w;
  }
  for (let j = 0; j < h.length; j++) h[j] /= sum;
  for (let x = 0; x < nTraces; x++) {
    const base = x * nSamples;
    for (let t = 0; t < nSamples; t++) {
      let acc = 0;
      const lo = Math.max(-half, -t);
      const hi = Math.min(half, nSamples - 1 - t);
      for (let j = lo; j <= hi; j++) acc += h[j + half] * data[base + t + j];
      out[base + t] = acc;
    }
  }
  return out;
}

export interface FillSlopeOptions {
  /** Regular decimation factor of the plan (1: estimate on the fine grid). */
  factor: number;
  /** Low-pass cutoff for the coarse-grid estimate as a fraction of the live traces' RMS frequency. */
  lowPassFraction?: number;
}

/** Slopes on the fine pair grid for filling the traces marked in `unknown`. */
export function slopesForFill(data: Float64Array, nTraces: number, nSamples: number, unknown: ArrayLike<number>, estimator: SlopeEstimator, options: FillSlopeOptions, cancel?: CancelToken): Float64Array {
  const live = new Uint8Array(nTraces);
  for (let x = 0; x < nTraces; x++) live[x] = unknown[x] ? 0 : 1;
  const k = options.factor;
  if (k <= 1) return estimator(data, nTraces, nSamples, live, cancel);
  // Coarse grid: the positions ≡ phase (mod k), phase taken from the first recorded trace.
  let phase = 0;
  while (phase < nTraces && !live[phase]) phase++;
  phase %= k;
  const nCoarse = Math.floor((nTraces - 1 - phase) / k) + 1;
  if (nCoarse < 2) return estimator(data, nTraces, nSamples, live, cancel);
  const coarse = new Float64Array(nCoarse * nSamples);
  const coarseLive = new Uint8Array(nCoarse);
  for (let c = 0; c < nCoarse; c++) {
    const x = phase + c * k;
    coarseLive[c] = live[x];
    if (live[x]) coarse.set(data.subarray(x * nSamples, (x + 1) * nSamples), c * nSamples);
  }
  const fRms = rmsFrequency(coarse, nCoarse, nSamples, coarseLive);
  const fc = Math.min(0.45, Math.max(0.01, (options.lowPassFraction ?? 0.6) * fRms));
  const smooth = lowPassTraces(new Float64Array(coarse.length), coarse, nCoarse, nSamples, fc);
  const sc = estimator(smooth, nCoarse, nSamples, coarseLive, cancel);
  // Interpolate σ_c / k along x at constant t: coarse pair c sits at fine position phase + k(c + ½).
  const nPairs = nTraces - 1;
  const out = new Float64Array(nPairs * nSamples);
  for (let q = 0; q < nPairs; q++) {
    const u = (q + 0.5 - phase) / k - 0.5;
    const c0 = Math.max(0, Math.min(nCoarse - 2, Math.floor(u)));
    const f = Math.max(0, Math.min(1, u - c0));
    const c1 = Math.min(nCoarse - 2, c0 + 1);
    for (let t = 0; t < nSamples; t++) out[q * nSamples + t] = ((1 - f) * sc[c0 * nSamples + t] + f * sc[c1 * nSamples + t]) / k;
  }
  return out;
}
