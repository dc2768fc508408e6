/**
 * The hold-out check that goes with every fill (methods.md §5, leave-out cross-validation): hide recorded
 * traces that look like the ones to fill, fill them with the same settings, and score the fill on the hidden
 * samples only (core/quality/snr.ts). Design rules, by what the plan fills:
 *   – a gap of G traces: a block of G recorded traces with recorded traces on both sides (at least
 *     max(2, ⌈G/4⌉)), placed where the most recorded traces support it on its poorer side, so the hidden
 *     block is an interior gap like the real one (narrower only when the gather has no room);
 *   – regular decimation by k: every k-th recorded trace (never the first or last), which leaves
 *     hidden traces 2k positions from their recorded neighbours: a harder problem than the real one, so the
 *     score leans pessimistic;
 *   – isolated missing or dead traces: every fourth recorded trace whose neighbours are both recorded.
 * Hidden traces never include traces that are themselves to be filled.
 */
import { unknownBlocks } from './plan';

export type HoldoutKind = 'block' | 'decimation' | 'single' | 'none';

export interface HoldoutDesign {
  kind: HoldoutKind;
  /** Recorded positions hidden for the check, sorted. */
  hidden: number[];
}

export function designHoldout(unknown: ArrayLike<number>, factor: number): HoldoutDesign {
  const n = unknown.length;
  const blocks = unknownBlocks(unknown);
  if (blocks.length === 0) return { kind: 'none', hidden: [] };
  let widest = blocks[0];
  for (const bl of blocks) if (bl[1] - bl[0] > widest[1] - widest[0]) widest = bl;
  const g = widest[1] - widest[0] + 1;
  if (g >= 2 && g > factor - 1) {
    const centre = (widest[0] + widest[1]) / 2;
    for (let width = g; width >= 1; width--) {
      const margin = Math.max(2, Math.ceil(width / 4));
      let best = -1;
      let bestDist = Infinity;
      for (let s = margin; s + width + margin <= n; s++) {
        let ok = true;
        for (let q = s - margin; q < s + width + margin && ok; q++) if (unknown[q]) ok = false;
        if (!ok) continue;
        // Best supported place: the most recorded traces on its poorer side (ties: nearest the gap).
        let l = s - 1;
        while (l >= 0 && !unknown[l]) l--;
        let r = s + width;
        while (r < n && !unknown[r]) r++;
        const support = Math.min(s - 1 - l, r - (s + width));
        const d = -support * n + Math.abs(s + (width - 1) / 2 - centre);
        if (d < bestDist) {
          bestDist = d;
          best = s;
        }
      }
      if (best >= 0) return { kind: 'block', hidden: Array.from({ length: width }, (_, i) => best + i) };
      if (width <= Math.max(1, factor - 1)) break;
    }
  }
  const live: number[] = [];
  for (let q = 0; q < n; q++) if (!unknown[q]) live.push(q);
  if (factor > 1) {
    const hidden = live.filter((_, j) => j % factor === 1 && j < live.length - 1);
    if (hidden.length) return { kind: 'decimation', hidden };
  }
  const hidden: number[] = [];
  let seen = 0;
  for (let q = 1; q < n - 1; q++) {
    if (unknown[q] || unknown[q - 1] || unknown[q + 1]) continue;
    if (hidden.length && hidden[hidden.length - 1] === q - 1) continue;
    if (seen++ % 4 === 1) hidden.push(q);
  }
  return hidden.length ? { kind: 'single', hidden } : { kind: 'none', hidden: [] };
}
