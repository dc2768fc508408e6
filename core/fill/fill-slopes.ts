/**
 * Slopes for a fill, from core/slope. On a regularly decimated gather the estimator works on the coarse grid
 * of recorded traces, low-passed below the aliasing frequency, and scales back to the fine grid (methods.md
 * §2.6 and §3.4); the fill passes the plan's factor explicitly because the hold-out check hides traces and
 * would spoil automatic detection.
 *
 * Layout: trace-major gathers; slopes on the pair grid (core/pwd/operator.ts), samples per trace.
 */
import type { CancelToken } from '../problems';
import { estimateSlopes, type SlopeOptions } from '../slope/index';

/** Any slope estimator: returns slopes on the pair grid, length (nTraces−1)·nSamples. */
export type SlopeEstimator = (data: Float64Array, nTraces: number, nSamples: number, liveTraces: Uint8Array, factor: number, cancel?: CancelToken) => Float64Array;

/** The estimator of core/slope with the given options (dip edits in the options are applied to every estimate). */
export function slopeEstimator(options: SlopeOptions = {}): SlopeEstimator {
  return (data, nTraces, nSamples, liveTraces, factor, cancel) =>
    estimateSlopes(data, nTraces, nSamples, liveTraces, { ...options, decimationFactor: factor }, cancel).slopePairs;
}

/** Slopes on the fine pair grid for filling the traces marked in `unknown`. */
export function slopesForFill(data: Float64Array, nTraces: number, nSamples: number, unknown: ArrayLike<number>, estimator: SlopeEstimator, factor: number, cancel?: CancelToken): Float64Array {
  const live = new Uint8Array(nTraces);
  for (let x = 0; x < nTraces; x++) live[x] = unknown[x] ? 0 : 1;
  return estimator(data, nTraces, nSamples, live, factor, cancel);
}

/**
 * Guards the fill against wild slopes in quiet parts of the gather (estimators are poorly constrained where
 * there is little energy, and a slope of tens of samples per trace makes the split destructor couple samples
 * far apart). Bound B = 2 × the energy-weighted 98th percentile of |σ| (weights: squared amplitude of the
 * recorded traces beside each pair), at least 1 sample per trace; slopes beyond ±B are clipped to it.
 * In place. @returns the number of clipped pair samples.
 */
export function clipWildSlopes(slopePairs: Float64Array, data: Float64Array, unknown: ArrayLike<number>, nTraces: number, nSamples: number): number {
  const nPairs = nTraces - 1;
  const n = nPairs * nSamples;
  if (n === 0) return 0;
  const idx = new Uint32Array(n);
  const wt = new Float64Array(n);
  let total = 0;
  for (let p = 0; p < nPairs; p++) {
    for (let t = 0; t < nSamples; t++) {
      const i = p * nSamples + t;
      let e = 0;
      if (!unknown[p]) e += data[p * nSamples + t] ** 2;
      if (!unknown[p + 1]) e += data[(p + 1) * nSamples + t] ** 2;
      wt[i] = e;
      total += e;
      idx[i] = i;
    }
  }
  if (total === 0) return 0;
  idx.sort((a, b) => Math.abs(slopePairs[a]) - Math.abs(slopePairs[b]));
  let acc = 0;
  let q98 = 0;
  for (let j = 0; j < n; j++) {
    acc += wt[idx[j]];
    if (acc >= 0.98 * total) {
      q98 = Math.abs(slopePairs[idx[j]]);
      break;
    }
  }
  const bound = Math.max(1, 2 * q98);
  let clipped = 0;
  for (let i = 0; i < n; i++) {
    const s = slopePairs[i];
    if (s > bound) {
      slopePairs[i] = bound;
      clipped++;
    } else if (s < -bound) {
      slopePairs[i] = -bound;
      clipped++;
    }
  }
  return clipped;
}

/** Traces kept on each side of a hidden block when its slopes are re-estimated (holdoutSlopesNearBlock). */
export const HOLDOUT_WINDOW_TRACES = 16;
/** Pairs beyond the block's own that take the window's estimate (the rest keep the gather's). */
const HOLDOUT_PAIRS_BESIDE = 4;

/**
 * Slopes for a block hold-out without a whole-gather estimate: the gather with the block hidden is cropped to
 * the block plus HOLDOUT_WINDOW_TRACES on each side (fewer at the gather's ends), slopes are estimated on the
 * crop, and they replace the gather's slopes on the block's pairs and HOLDOUT_PAIRS_BESIDE pairs either side:
 * the only pairs the least-squares fill and its start read for the block. Elsewhere the gather's own slopes
 * stay; they matter only for other holes, which the hold-out does not score.
 * Known bias (docs/fill.md): the crop's own band edge, steepest slope and levels are measured on fewer traces,
 * so the slopes near the block differ slightly from a whole-gather re-estimate (measured: hold-out scores within
 * a few tenths of a dB on the benchmark gathers).
 * @param hidden  hidden trace positions, contiguous and sorted
 */
export function holdoutSlopesNearBlock(
  slopes: Float64Array, dataHidden: Float64Array, nTraces: number, nSamples: number, unknownHidden: Uint8Array,
  hidden: readonly number[], estimator: SlopeEstimator, cancel?: CancelToken,
): Float64Array {
  const lo = hidden[0], hi = hidden[hidden.length - 1];
  const a = Math.max(0, lo - HOLDOUT_WINDOW_TRACES), b = Math.min(nTraces - 1, hi + HOLDOUT_WINDOW_TRACES);
  const n = b - a + 1;
  const crop = dataHidden.subarray(a * nSamples, (b + 1) * nSamples);
  const cropSlopes = slopesForFill(Float64Array.from(crop), n, nSamples, unknownHidden.subarray(a, b + 1), estimator, 1, cancel);
  const out = slopes.slice();
  const p0 = Math.max(a, lo - 1 - HOLDOUT_PAIRS_BESIDE), p1 = Math.min(b - 1, hi + HOLDOUT_PAIRS_BESIDE);
  for (let p = p0; p <= p1; p++) out.set(cropSlopes.subarray((p - a) * nSamples, (p - a + 1) * nSamples), p * nSamples);
  return out;
}
