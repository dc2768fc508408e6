/**
 * Display gain: the multipliers that turn true amplitudes into the [-1, 1] range the colour scale and wiggles
 * use. Display only; the fill and the exported traces always use true amplitudes.
 * Layout: trace-major data[trace * nSamples + sample] (core/grid/gather.ts).
 *
 * Order (common practice, no source): trace balance (divide by each trace's RMS), then AGC (divide by the RMS
 * in a sliding window), then a single clip level from a percentile of |value| over live traces.
 * The gain is computed once from a reference gather and applied unchanged to before, after and the
 * difference, so the three views share one clip (methods.md §5: "plot differences at the same clip").
 */
export interface GainSettings {
  /** Divide each trace by its RMS before anything else. */
  traceBalance: boolean;
  /** AGC window length in milliseconds; 0 switches AGC off. */
  agcWindowMs: number;
  /** Percentile of |value| that maps to full colour / one trace spacing of wiggle, in (50, 100]. */
  clipPercentile: number;
}

export const DEFAULT_GAIN: GainSettings = { traceBalance: false, agcWindowMs: 0, clipPercentile: 98 };

/**
 * Display gain = factor · scale[i]: per-sample multipliers (trace-major) when balance or AGC is on, else
 * null (plain clip: one factor for every sample, no per-sample array to build).
 */
export interface DisplayGain {
  readonly scale: Float32Array | null;
  /** 1 / clip. */
  readonly factor: number;
  /** The clip level in the units of the gained-but-unclipped samples. */
  readonly clip: number;
}

/**
 * Builds the display gain from `reference`. `live[i]` = 1 for traces that take part in balance and clip
 * (missing and dead traces are all zero and would drag the percentile down).
 */
export function computeDisplayGain(reference: Float32Array, nTraces: number, nSamples: number, live: Uint8Array,
  dtSeconds: number, settings: GainSettings, out?: Float32Array): DisplayGain {
  const half = Math.floor((settings.agcWindowMs / 1000 / dtSeconds) / 2);
  const agc = settings.agcWindowMs > 0 && half >= 1;
  if (!settings.traceBalance && !agc) {
    const clip = percentileAbs(reference, null, nTraces, nSamples, live, settings.clipPercentile);
    return { scale: null, factor: clip > 0 ? 1 / clip : 1, clip };
  }
  const scale = out ?? new Float32Array(nTraces * nSamples);
  scale.fill(1);
  if (settings.traceBalance) {
    for (let x = 0; x < nTraces; x++) {
      const base = x * nSamples;
      let s = 0;
      for (let t = 0; t < nSamples; t++) s += reference[base + t] * reference[base + t];
      const rms = Math.sqrt(s / Math.max(1, nSamples));
      const g = rms > 0 ? 1 / rms : 1;
      for (let t = 0; t < nSamples; t++) scale[base + t] = g;
    }
  }
  if (agc) {
    const sums = new Float64Array(nSamples + 1);
    for (let x = 0; x < nTraces; x++) {
      const base = x * nSamples;
      sums[0] = 0;
      for (let t = 0; t < nSamples; t++) {
        const v = reference[base + t] * scale[base + t];
        sums[t + 1] = sums[t] + v * v;
      }
      let traceMax = 0;
      for (let t = 0; t < nSamples; t++) {
        const lo = Math.max(0, t - half);
        const hi = Math.min(nSamples, t + half + 1);
        const rms = Math.sqrt(Math.max(0, sums[hi] - sums[lo]) / (hi - lo));
        if (rms > traceMax) traceMax = rms;
      }
      // A floor at 1e-3 of the trace's largest window RMS keeps silent stretches from blowing up noise.
      const floor = traceMax * 1e-3;
      for (let t = 0; t < nSamples; t++) {
        const lo = Math.max(0, t - half);
        const hi = Math.min(nSamples, t + half + 1);
        const rms = Math.sqrt(Math.max(0, sums[hi] - sums[lo]) / (hi - lo));
        scale[base + t] *= rms > floor ? 1 / rms : floor > 0 ? 1 / floor : 1;
      }
    }
  }
  const clip = percentileAbs(reference, scale, nTraces, nSamples, live, settings.clipPercentile);
  return { scale, factor: clip > 0 ? 1 / clip : 1, clip };
}

/**
 * Percentile of |reference·scale| over live traces, from a strided sample of at most ~65 536 values
 * (enough for a display clip; exact order statistics would sort millions of values on every change).
 * With fewer values than that, it is the exact linear-interpolation percentile (numpy's default).
 */
export function percentileAbs(reference: Float32Array, scale: Float32Array | null, nTraces: number, nSamples: number,
  live: Uint8Array, percentile: number): number {
  let nLive = 0;
  for (let x = 0; x < nTraces; x++) if (live[x]) nLive++;
  const total = nLive * nSamples;
  if (total === 0) return 0;
  const stride = Math.max(1, Math.ceil(total / 65_536));
  const values = new Float32Array(Math.ceil(total / stride));
  let k = 0;
  let next = 0; // index, counted over live samples only, of the next value to keep
  let seen = 0;
  for (let x = 0; x < nTraces; x++) {
    if (!live[x]) continue;
    const base = x * nSamples;
    for (; next < seen + nSamples && k < values.length; next += stride) {
      const i = base + (next - seen);
      values[k++] = Math.abs(scale ? reference[i] * scale[i] : reference[i]);
    }
    seen += nSamples;
  }
  const v = values.subarray(0, k).sort();
  const p = Math.min(100, Math.max(0, percentile)) / 100;
  const pos = p * (k - 1);
  const i = Math.floor(pos);
  const f = pos - i;
  return i + 1 < k ? v[i] * (1 - f) + v[i + 1] * f : v[i];
}

/** out[i] = data[i] · factor · scale[i]. @returns out */
export function applyDisplayGain(out: Float32Array, data: Float32Array, gain: DisplayGain): Float32Array {
  const s = gain.scale;
  const f = gain.factor;
  if (s) for (let i = 0; i < out.length; i++) out[i] = data[i] * s[i] * f;
  else for (let i = 0; i < out.length; i++) out[i] = data[i] * f;
  return out;
}
