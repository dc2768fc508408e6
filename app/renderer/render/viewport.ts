/**
 * The visible window of a gather: a range of trace positions across and of time samples down, in
 * fractional trace and sample units (trace i covers [i, i+1) on screen, its centre at i + 0.5).
 * Pure arithmetic, no DOM: the section view and the state classes share it, and unit tests check it.
 */
export interface Window2D {
  traceStart: number;
  traceEnd: number;
  sampleStart: number;
  sampleEnd: number;
}

export interface PlotRect {
  left: number;
  top: number;
  width: number;
  height: number;
}

/** Smallest window: 4 traces × 16 samples, so a zoom can never collapse the view to nothing. */
const MIN_TRACES = 4;
const MIN_SAMPLES = 16;

export function fullWindow(nTraces: number, nSamples: number): Window2D {
  return { traceStart: 0, traceEnd: nTraces, sampleStart: 0, sampleEnd: nSamples };
}

/** Keeps the window inside the gather and at least the minimum size. */
export function clampWindow(w: Window2D, nTraces: number, nSamples: number): Window2D {
  const spanT = Math.min(nTraces, Math.max(Math.min(MIN_TRACES, nTraces), w.traceEnd - w.traceStart));
  const spanS = Math.min(nSamples, Math.max(Math.min(MIN_SAMPLES, nSamples), w.sampleEnd - w.sampleStart));
  const t0 = Math.min(nTraces - spanT, Math.max(0, w.traceStart));
  const s0 = Math.min(nSamples - spanS, Math.max(0, w.sampleStart));
  return { traceStart: t0, traceEnd: t0 + spanT, sampleStart: s0, sampleEnd: s0 + spanS };
}

/**
 * Zooms by `factor` (> 1 zooms in) about an anchor point that stays under the cursor.
 * `axes` limits the zoom to one direction (shift-wheel zooms time only, common practice, no source).
 */
export function zoomAbout(w: Window2D, factor: number, anchorTrace: number, anchorSample: number,
  nTraces: number, nSamples: number, axes: 'both' | 'traces' | 'time' = 'both'): Window2D {
  const ft = axes === 'time' ? 1 : factor;
  const fs = axes === 'traces' ? 1 : factor;
  const next: Window2D = {
    traceStart: anchorTrace - (anchorTrace - w.traceStart) / ft,
    traceEnd: anchorTrace + (w.traceEnd - anchorTrace) / ft,
    sampleStart: anchorSample - (anchorSample - w.sampleStart) / fs,
    sampleEnd: anchorSample + (w.sampleEnd - anchorSample) / fs,
  };
  return clampWindow(next, nTraces, nSamples);
}

export function panBy(w: Window2D, dTraces: number, dSamples: number, nTraces: number, nSamples: number): Window2D {
  return clampWindow({
    traceStart: w.traceStart + dTraces, traceEnd: w.traceEnd + dTraces,
    sampleStart: w.sampleStart + dSamples, sampleEnd: w.sampleEnd + dSamples,
  }, nTraces, nSamples);
}

/** Screen pixel → fractional trace and sample coordinates. */
export function screenToData(w: Window2D, rect: PlotRect, px: number, py: number): { trace: number; sample: number } {
  return {
    trace: w.traceStart + ((px - rect.left) / rect.width) * (w.traceEnd - w.traceStart),
    sample: w.sampleStart + ((py - rect.top) / rect.height) * (w.sampleEnd - w.sampleStart),
  };
}

export function dataToScreen(w: Window2D, rect: PlotRect, trace: number, sample: number): { x: number; y: number } {
  return {
    x: rect.left + ((trace - w.traceStart) / (w.traceEnd - w.traceStart)) * rect.width,
    y: rect.top + ((sample - w.sampleStart) / (w.sampleEnd - w.sampleStart)) * rect.height,
  };
}

/** A "nice" tick step (1, 2 or 5 × 10^k) giving about `target` ticks over `span`. */
export function niceStep(span: number, target: number): number {
  if (!(span > 0)) return 1;
  const raw = span / Math.max(1, target);
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * p;
}
