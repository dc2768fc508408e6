/**
 * The bridge between the section's tools and the dip-edit model of core/slope/edits.ts: builds edits from
 * what the user drew, applies an edit list to an estimate, validates saved lists, and gives the shapes the
 * overlay draws. History entries are edits, plus one UI-only entry, "restore all", which empties the list
 * in one undoable step (the saved list is always the effective one, in core form).
 */
import { applyDipEdits, linkPath, validateDipEdits, type DipEdit, type DipPoint } from '../../../core/slope/edits';
import { pairsToTracesUnchecked } from '../../../core/slope/pair-grid';

export type EditPoint = DipPoint;
export type DipEditJson = DipEdit | { readonly kind: 'restore-all' };

export interface BrushSettings {
  mode: 'set' | 'add';
  valueSamplesPerTrace: number;
  radiusTraces: number;
  /** Brush radius in time samples (the view converts its circle on screen into traces and samples). */
  radiusSamples: number;
  softness: number;
}

export interface RegionSettings {
  mode: 'set' | 'smooth';
  valueSamplesPerTrace: number;
}

/** The edit list in effect: everything after the last "restore all". */
export function effectiveEdits(history: readonly DipEditJson[]): DipEdit[] {
  let start = 0;
  history.forEach((e, i) => { if (e.kind === 'restore-all') start = i + 1; });
  return history.slice(start) as DipEdit[];
}

export const DIP_EDIT_MODEL = {
  brush(points: readonly EditPoint[], s: BrushSettings): DipEditJson {
    // Thin the stroke: a point every quarter radius is enough for the segment-distance brush.
    const step = Math.max(0.25 * s.radiusTraces, 0.5);
    const kept: DipPoint[] = [];
    for (const p of points) {
      const last = kept[kept.length - 1];
      if (!last || Math.hypot(p.trace - last.trace, ((p.sample - last.sample) * s.radiusTraces) / s.radiusSamples) >= step) kept.push({ trace: p.trace, sample: p.sample });
    }
    const tail = points[points.length - 1];
    if (kept[kept.length - 1] !== tail && (kept[kept.length - 1].trace !== tail.trace || kept[kept.length - 1].sample !== tail.sample)) kept.push({ trace: tail.trace, sample: tail.sample });
    return {
      kind: 'brush', mode: s.mode, slopeSamplesPerTrace: s.valueSamplesPerTrace, points: kept,
      radiusTraces: s.radiusTraces, radiusSamples: Math.max(0.5, s.radiusSamples), softness: s.softness,
    };
  },

  region(polygon: readonly EditPoint[], s: RegionSettings): DipEditJson {
    const pts = polygon.map((p) => ({ trace: p.trace, sample: p.sample }));
    return s.mode === 'set'
      ? { kind: 'region', polygon: pts, action: 'set', slopeSamplesPerTrace: s.valueSamplesPerTrace }
      : { kind: 'region', polygon: pts, action: 'smooth' };
  },

  link(a: EditPoint, b: EditPoint): DipEditJson {
    return { kind: 'link', from: { trace: a.trace, sample: a.sample }, to: { trace: b.trace, sample: b.sample } };
  },

  restoreAll(): DipEditJson {
    return { kind: 'restore-all' };
  },

  /**
   * Estimate (pair grid) with the history's effective edits applied. Returns the edited pair field and its
   * trace-grid mapping (core/slope/pair-grid.ts).
   */
  apply(estimatePairs: Float64Array, nTraces: number, nSamples: number, history: readonly DipEditJson[]): { pairs: Float64Array; traces: Float64Array } {
    const pairs = estimatePairs.slice();
    const edits = effectiveEdits(history);
    if (edits.length) applyDipEdits(pairs, new Float64Array(pairs.length), nTraces, nSamples, edits);
    const traces = pairsToTracesUnchecked(new Float64Array(nTraces * nSamples), pairs, nTraces, nSamples);
    return { pairs, traces };
  },

  /** Saved lists (autosave) hold effective core edits; null when they do not validate. */
  validate(list: unknown): DipEditJson[] | null {
    try {
      return [...validateDipEdits(list)];
    } catch {
      return null;
    }
  },

  /** Outlines for the overlay: region polygons and link paths (sampled along the Hermite curve). */
  shapes(history: readonly DipEditJson[], slopeAt: (trace: number, sample: number) => number): { polygons: DipPoint[][]; curves: DipPoint[][] } {
    const polygons: DipPoint[][] = [];
    const curves: DipPoint[][] = [];
    for (const e of effectiveEdits(history)) {
      if (e.kind === 'region') polygons.push([...e.polygon]);
      else if (e.kind === 'link') {
        const [a, b] = e.from.trace <= e.to.trace ? [e.from, e.to] : [e.to, e.from];
        // End slopes as core/slope/edits.ts reads them: just outside each pick.
        const sa = slopeAt(Math.round(a.trace) - 1, a.sample);
        const sb = slopeAt(Math.round(b.trace) + 1, b.sample);
        const pts: DipPoint[] = [];
        const n = 24;
        for (let i = 0; i <= n; i++) {
          const x = a.trace + ((b.trace - a.trace) * i) / n;
          pts.push({ trace: x, sample: linkPath(a, b, sa, sb, x).sample });
        }
        curves.push(pts);
      }
    }
    return { polygons, curves };
  },
};
