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
