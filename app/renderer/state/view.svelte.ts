/**
 * How the section is shown: display mode, colour scale, gain, the visible window, the dip layer and which
 * of before / after / difference is on screen. Rune state in a plain class (testable in node, where runes
 * compile to plain fields).
 */
import type { AmplitudeScaleName } from '../render/colormap';
import type { DisplayMode } from '../render/draw-section';
import { DEFAULT_GAIN, type GainSettings } from '../render/gain';
import { clampWindow, fullWindow, panBy, zoomAbout, type Window2D } from '../render/viewport';

export type Compare = 'before' | 'after' | 'difference';
export type SlopeUnit = 'samples-per-trace' | 'ms-per-trace' | 's-per-km';

export class ViewState {
  mode = $state<DisplayMode>('density');
  scale = $state<AmplitudeScaleName>('grey');
  gain = $state<GainSettings>({ ...DEFAULT_GAIN });
  wiggleGain = $state(1);
  window = $state<Window2D>({ traceStart: 0, traceEnd: 1, sampleStart: 0, sampleEnd: 1 });
  dipLayer = $state(false);
  dipOpacity = $state(0.55);
  dipStrokes = $state(false);
  slopeUnit = $state<SlopeUnit>('ms-per-trace');
  compare = $state<Compare>('before');
  #nTraces = 1;
  #nSamples = 1;

  /** New gather: keep the window if the shape is unchanged (stepping through gathers), else show all. */
  setShape(nTraces: number, nSamples: number): void {
    const same = nTraces === this.#nTraces && nSamples === this.#nSamples;
    this.#nTraces = nTraces;
    this.#nSamples = nSamples;
    this.window = same ? clampWindow(this.window, nTraces, nSamples) : fullWindow(nTraces, nSamples);
  }

  zoom(factor: number, anchorTrace: number, anchorSample: number, axes: 'both' | 'traces' | 'time' = 'both'): void {
    this.window = zoomAbout(this.window, factor, anchorTrace, anchorSample, this.#nTraces, this.#nSamples, axes);
  }

  pan(dTraces: number, dSamples: number): void {
    this.window = panBy(this.window, dTraces, dSamples, this.#nTraces, this.#nSamples);
  }

  showAll(): void {
    this.window = fullWindow(this.#nTraces, this.#nSamples);
  }

  /**
   * Keyboard navigation (our own bindings): arrows pan by a tenth of the window, + and − zoom about the
   * centre, Home shows the whole gather. Returns true when the key was used.
   */
  handleKey(key: string): boolean {
    const w = this.window;
    const dt = (w.traceEnd - w.traceStart) / 10;
    const ds = (w.sampleEnd - w.sampleStart) / 10;
    const ct = (w.traceStart + w.traceEnd) / 2;
    const cs = (w.sampleStart + w.sampleEnd) / 2;
    switch (key) {
      case 'ArrowLeft': this.pan(-dt, 0); return true;
      case 'ArrowRight': this.pan(dt, 0); return true;
      case 'ArrowUp': this.pan(0, -ds); return true;
      case 'ArrowDown': this.pan(0, ds); return true;
      case '+': case '=': this.zoom(1.25, ct, cs); return true;
      case '-': case '_': this.zoom(0.8, ct, cs); return true;
      case 'Home': this.showAll(); return true;
      default: return false;
    }
  }

  /** Plain data for autosave and recipes (display settings only). */
  toJSON(): { mode: DisplayMode; scale: AmplitudeScaleName; gain: GainSettings; wiggleGain: number; slopeUnit: SlopeUnit } {
    return { mode: this.mode, scale: this.scale, gain: { ...this.gain }, wiggleGain: this.wiggleGain, slopeUnit: this.slopeUnit };
  }

  restore(v: Partial<ReturnType<ViewState['toJSON']>>): void {
    if (v.mode === 'density' || v.mode === 'wiggle' || v.mode === 'both') this.mode = v.mode;
    if (v.scale === 'grey' || v.scale === 'loam') this.scale = v.scale;
    if (v.gain && typeof v.gain === 'object') {
      const g = v.gain;
      this.gain = {
        traceBalance: Boolean(g.traceBalance),
        agcWindowMs: Number.isFinite(g.agcWindowMs) && g.agcWindowMs >= 0 ? g.agcWindowMs : 0,
        clipPercentile: Number.isFinite(g.clipPercentile) && g.clipPercentile > 50 && g.clipPercentile <= 100 ? g.clipPercentile : 98,
      };
    }
    if (Number.isFinite(v.wiggleGain) && (v.wiggleGain as number) > 0) this.wiggleGain = v.wiggleGain as number;
    if (v.slopeUnit === 'samples-per-trace' || v.slopeUnit === 'ms-per-trace' || v.slopeUnit === 's-per-km') this.slopeUnit = v.slopeUnit;
  }
}
