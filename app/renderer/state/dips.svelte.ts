/**
 * The dip field of the current gather: the estimate (from the worker) and the user's edits, kept apart so a
 * re-estimate never erases them; the effective field is always "estimate with edits applied". Undo/redo
 * without limit (state/history.ts). Rune state in a plain class, testable in node.
 *
 * Slopes are in samples per trace throughout (core/slope/units.ts converts for display). Trace grid:
 * field[trace * nSamples + sample]; pair grid for the fill: (nTraces−1)·nSamples (core/slope/pair-grid.ts).
 */
import type { DipEdit } from '../../../core/slope/edits';
import type { SlopeOptions, SlopeResult } from '../workers/protocol';
import { EditHistory } from './history';
import { DIP_EDIT_MODEL, effectiveEdits, type DipEditJson, type EditPoint } from './dip-edit-model';

export type BrushMode = 'set' | 'add';
export type RegionMode = 'set' | 'smooth';

export const DEFAULT_SLOPE_OPTIONS: SlopeOptions = { method: 'pwd', radiusTimeSamples: 8, radiusTraces: 4, order: 2 };

export class DipsState {
  options = $state<SlopeOptions>({ ...DEFAULT_SLOPE_OPTIONS });
  estimate = $state.raw<SlopeResult | null>(null);
  running = $state(false);
  /** Bumps whenever the effective field changes (estimate or edits). */
  version = $state(0);
  /** Brush: set to a value or add to the field, radius in traces, soft edge 0 (hard) .. 1 (fully tapered). */
  brushMode = $state<BrushMode>('set');
  /** Brush value in samples per trace (the panel converts from the display unit). */
  brushValue = $state(0);
  brushRadiusTraces = $state(4);
  brushSoftness = $state(0.5);
  regionMode = $state<RegionMode>('smooth');
  regionValue = $state(0);
  /** First click of an event link, waiting for the second. */
  linkPick = $state.raw<EditPoint | null>(null);
  #history = new EditHistory<DipEditJson>();
  #nTraces = 0;
  #nSamples = 0;
  #effective: { pairs: Float64Array; traces: Float64Array } | null = null;
  #effectiveVersion = -1;

  setGather(nTraces: number, nSamples: number, edits: readonly DipEditJson[] = []): void {
    this.#nTraces = nTraces;
    this.#nSamples = nSamples;
    this.estimate = null;
    this.linkPick = null;
    this.#history.reset(edits);
    this.#effective = null;
    this.version++;
  }

  setEstimate(result: SlopeResult): void {
    this.estimate = result;
    this.#effective = null;
    this.version++;
  }

  /** The edits in effect (after the last "restore all"), in core form: what autosave and recipes keep. */
  get edits(): readonly DipEdit[] {
    void this.version;
    return effectiveEdits(this.#history.edits);
  }

  /** The whole history list including "restore all" entries (for the overlay and tests). */
  get history(): readonly DipEditJson[] {
    return this.#history.edits;
  }

  get canUndo(): boolean {
    void this.version;
    return this.#history.canUndo;
  }

  get canRedo(): boolean {
    void this.version;
    return this.#history.canRedo;
  }

  #push(edit: DipEditJson): void {
    this.#history.push(edit);
    this.#effective = null;
    this.version++;
  }

  undo(): boolean {
    const e = this.#history.undo();
    if (e === undefined) return false;
    this.#effective = null;
    this.version++;
    return true;
  }

  redo(): boolean {
    const e = this.#history.redo();
    if (e === undefined) return false;
    this.#effective = null;
    this.version++;
    return true;
  }

  /** One stroke = one undoable edit. `samplesPerTrace` is the screen aspect, so the brush is round on screen. */
  brush(points: readonly EditPoint[], samplesPerTrace = 1): void {
    if (!points.length) return;
    this.#push(DIP_EDIT_MODEL.brush(points, {
      mode: this.brushMode, valueSamplesPerTrace: this.brushValue, radiusTraces: this.brushRadiusTraces,
      radiusSamples: this.brushRadiusTraces * samplesPerTrace, softness: this.brushSoftness,
    }));
  }

  region(polygon: readonly EditPoint[]): void {
    if (polygon.length < 3) return;
    this.#push(DIP_EDIT_MODEL.region(polygon, { mode: this.regionMode, valueSamplesPerTrace: this.regionValue }));
  }

  /** Event linking: the first click stores a pick; the second (on the other side of the gap) makes the edit. */
  pickLink(p: EditPoint): 'first' | 'linked' | 'same-side' {
    const first = this.linkPick;
    if (!first) {
      this.linkPick = p;
      return 'first';
    }
    if (Math.abs(p.trace - first.trace) < 1) return 'same-side';
    this.linkPick = null;
    this.#push(DIP_EDIT_MODEL.link(first, p));
    return 'linked';
  }

  /** Back to the estimate: drops every edit in one undoable step (undo brings them all back). */
  restoreAll(): void {
    if (!this.edits.length) return;
    this.#push(DIP_EDIT_MODEL.restoreAll());
  }

  get hasField(): boolean {
    void this.version;
    return this.estimate !== null;
  }

  #field(): { pairs: Float64Array; traces: Float64Array } | null {
    if (!this.estimate) return null;
    if (this.#effective && this.#effectiveVersion === this.version) return this.#effective;
    this.#effective = DIP_EDIT_MODEL.apply(this.estimate.slopePairs, this.#nTraces, this.#nSamples, this.#history.edits);
    this.#effectiveVersion = this.version;
    return this.#effective;
  }

  /** Estimate with the edits applied, trace grid (samples per trace); null before the first estimate. */
  effectiveTraces(): Float64Array | null {
    return this.#field()?.traces ?? null;
  }

  /** Edited field on the pair grid, where edits act and what the fill takes (core/slope/edits.ts). */
  effectivePairs(): Float64Array | null {
    return this.#field()?.pairs ?? null;
  }

  /** Slope at a trace position and sample of the edited field (0 outside or before an estimate). */
  slopeAt(trace: number, sample: number): number {
    const f = this.effectiveTraces();
    if (!f) return 0;
    const x = Math.min(this.#nTraces - 1, Math.max(0, Math.round(trace)));
    const t = Math.min(this.#nSamples - 1, Math.max(0, Math.round(sample)));
    return f[x * this.#nSamples + t];
  }
}
