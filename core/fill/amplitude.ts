/**
 * Amplitude check of a fill: the RMS of filled traces against the RMS of the recorded traces beside them.
 * A least-squares or network fill that decays toward zero inside a wide gap shows up as a ratio well below 1
 * (methods.md §4.7: u = const satisfies the plane-wave equation, so the weak solution is always nearby).
 * Layout: trace-major (core/grid/gather.ts).
 */
import { rmsOfTraces } from '../quality/snr';
import { unknownBlocks } from './plan';

/**
 * RMS(filled traces of the widest block) / RMS(up to as many recorded traces on each side).
 * NaN when nothing was filled or no recorded neighbour has energy.
 */
export function gapRmsRatio(data: ArrayLike<number>, unknown: ArrayLike<number>, nSamples: number): number {
  const blocks = unknownBlocks(unknown);
  if (!blocks.length) return Number.NaN;
  let [a, b] = blocks[0];
  for (const [x, y] of blocks) if (y - x > b - a) [a, b] = [x, y];
  const g = b - a + 1;
  const filled = Array.from({ length: g }, (_, i) => a + i);
  const near: number[] = [];
  for (let q = a - 1; q >= 0 && near.length < g; q--) if (!unknown[q]) near.push(q);
  const left = near.length;
  for (let q = b + 1; q < unknown.length && near.length < left + g; q++) if (!unknown[q]) near.push(q);
  const ref = rmsOfTraces(data, near, nSamples);
  return ref > 0 ? rmsOfTraces(data, filled, nSamples) / ref : Number.NaN;
}

/** RMS(all filled traces) / RMS(all recorded traces). NaN when either set is empty or silent. */
export function fillRmsRatio(data: ArrayLike<number>, unknown: ArrayLike<number>, nSamples: number): number {
  const filled: number[] = [];
  const live: number[] = [];
  for (let q = 0; q < unknown.length; q++) (unknown[q] ? filled : live).push(q);
  const ref = rmsOfTraces(data, live, nSamples);
  return filled.length && ref > 0 ? rmsOfTraces(data, filled, nSamples) / ref : Number.NaN;
}

/**
 * Keeps filled traces from being much quieter than the recorded traces around them: each filled trace whose RMS
 * is below 80 % (1/LIFT_TOLERANCE) of the distance-weighted RMS of the nearest recorded trace on each side is
 * scaled up to that 80 % (at most ×maxGain). Blending two predictions that do not line up cancels energy; this
 * restores the level (trace balancing, common practice, no source) at some cost in SNR where the fill is
 * uncertain. Whole traces by default: time windows would compare events that moveout has moved to other
 * windows across a wide gap. Fills within 80 % are left bit for bit. In place. @returns the largest gain applied
 */
/** A filled trace (or window) is lifted only when its RMS is below 1/1.25 = 80 % of the level its neighbours imply. */
export const LIFT_TOLERANCE = 1.25;

export function liftQuietFills(u: Float64Array, unknown: ArrayLike<number>, nTraces: number, nSamples: number, windowSamples = 2 * nSamples, maxGain = 2): number {
  const hop = Math.max(1, Math.floor(windowSamples / 2));
  const nWin = Math.max(1, Math.ceil(nSamples / hop));
  const ms = (trace: number, w: number): number => {
    const c = w * hop;
    const lo = Math.max(0, c - hop);
    const hi = Math.min(nSamples, c + hop);
    let s = 0;
    for (let t = lo; t < hi; t++) s += u[trace * nSamples + t] ** 2;
    return hi > lo ? s / (hi - lo) : 0;
  };
  let largest = 1;
  const gains = new Float64Array(nWin);
  for (let x = 0; x < nTraces; x++) {
    if (!unknown[x]) continue;
    let l = x - 1;
    while (l >= 0 && unknown[l]) l--;
    let r = x + 1;
    while (r < nTraces && unknown[r]) r++;
    if (l < 0 && r >= nTraces) continue;
    const wR = l < 0 ? 1 : r >= nTraces ? 0 : (x - l) / (r - l);
    for (let w = 0; w < nWin; w++) {
      const target = (l >= 0 ? (1 - wR) * ms(l, w) : 0) + (r < nTraces ? wR * ms(r, w) : 0);
      const have = ms(x, w);
      // Only a deficit beyond 1/LIFT_TOLERANCE is lifted (to that level): fills that are right, whose level
      // differs from their neighbours' by a few per cent, are left exactly as they are.
      gains[w] = have > 0 ? Math.min(maxGain, Math.max(1, Math.sqrt(target / have) / LIFT_TOLERANCE)) : 1;
      largest = Math.max(largest, gains[w]);
    }
    for (let t = 0; t < nSamples; t++) {
      const p = t / hop;
      const w0 = Math.min(nWin - 1, Math.floor(p));
      const w1 = Math.min(nWin - 1, w0 + 1);
      const f = p - w0;
      u[x * nSamples + t] *= (1 - f) * gains[w0] + f * gains[w1];
    }
  }
  return largest;
}
