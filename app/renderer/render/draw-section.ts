/**
 * Draws a gather section on a 2-D canvas: the variable-density picture (pre-built by section-image.ts and
 * blitted), wiggles with positive fill, dip strokes, the trace-status strip and the axes.
 * Trade conventions (common practice, no source): time increases downwards, positions increase to the
 * right, positive amplitudes fill to the right of the wiggle baseline.
 */
import { dataToScreen, niceStep, type PlotRect, type Window2D } from './viewport';
import { STATUS_STYLES, TraceStatus, runsOf, type TraceStatusCode } from './trace-status';

export type DisplayMode = 'density' | 'wiggle' | 'both';

export interface SectionScene {
  readonly nTraces: number;
  readonly nSamples: number;
  readonly dtSeconds: number;
  readonly shown: Float32Array;
  readonly status: Uint8Array;
  readonly mode: DisplayMode;
  readonly window: Window2D;
  /** Label values for the top axis, one per trace position (e.g. position in m), or null for trace numbers. */
  readonly positionLabels: Float64Array | null;
  readonly positionTitle: string;
  /** Wiggle excursion in trace spacings at |shown| = 1. */
  readonly wiggleGain: number;
  /** Slope strokes: per trace position and sample, samples per trace, with confidence 0..1. */
  readonly strokes: { slope: Float32Array; confidence: Float32Array | null } | null;
}

export const STRIP_HEIGHT = 12;
export const MARGIN = { left: 58, top: 36 + STRIP_HEIGHT, right: 10, bottom: 8 };

export function plotRectFor(widthPx: number, heightPx: number): PlotRect {
  return {
    left: MARGIN.left, top: MARGIN.top,
    width: Math.max(10, widthPx - MARGIN.left - MARGIN.right),
    height: Math.max(10, heightPx - MARGIN.top - MARGIN.bottom),
  };
}

export interface DrawStats {
  wiggleTraceStep: number;
  strokes: number;
}

/** `image` holds the density picture (width nSamples, height nTraces: render/section-image.ts) or is null in wiggle-only mode. */
export function drawSection(ctx: CanvasRenderingContext2D, widthPx: number, heightPx: number, scene: SectionScene,
  image: CanvasImageSource | null): DrawStats {
  const rect = plotRectFor(widthPx, heightPx);
  const w = scene.window;
  ctx.save();
  ctx.fillStyle = '#f4f2ec';
  ctx.fillRect(0, 0, widthPx, heightPx);
  ctx.beginPath();
  ctx.rect(rect.left, rect.top, rect.width, rect.height);
  ctx.clip();
  ctx.fillStyle = '#fcfbf7';
  ctx.fillRect(rect.left, rect.top, rect.width, rect.height);
  if (image) {
    // The picture is stored trace-major (nSamples wide, nTraces high): swap the axes while drawing it.
    ctx.save();
    ctx.transform(0, 1, 1, 0, 0, 0);
    ctx.imageSmoothingEnabled = false;
    ctx.drawImage(image, w.sampleStart, w.traceStart, w.sampleEnd - w.sampleStart, w.traceEnd - w.traceStart,
      rect.top, rect.left, rect.height, rect.width);
    ctx.restore();
  }
  drawMissingHatch(ctx, rect, scene, image === null);
  const stats: DrawStats = { wiggleTraceStep: 0, strokes: 0 };
  if (scene.mode !== 'density') stats.wiggleTraceStep = drawWiggles(ctx, rect, scene);
  if (scene.strokes) stats.strokes = drawStrokes(ctx, rect, scene);
  drawFilledBrackets(ctx, rect, scene);
  ctx.restore();
  drawStatusStrip(ctx, rect, scene);
  drawAxes(ctx, rect, scene);
  return stats;
}

function drawWiggles(ctx: CanvasRenderingContext2D, rect: PlotRect, scene: SectionScene): number {
  const w = scene.window;
  const pxPerTrace = rect.width / (w.traceEnd - w.traceStart);
  const pxPerSample = rect.height / (w.sampleEnd - w.sampleStart);
  // Below 2 px per trace wiggles merge into a smear: draw every k-th trace and say so (DrawStats).
  const step = Math.max(1, Math.ceil(2 / pxPerTrace));
  const sStep = Math.max(1, Math.floor(1 / pxPerSample));
  const s0 = Math.max(0, Math.floor(w.sampleStart));
  const s1 = Math.min(scene.nSamples - 1, Math.ceil(w.sampleEnd));
  const t0 = Math.max(0, Math.floor(w.traceStart) - 1);
  const t1 = Math.min(scene.nTraces - 1, Math.ceil(w.traceEnd) + 1);
  const amp = pxPerTrace * step * scene.wiggleGain;
  const limit = pxPerTrace * step * 1.5;
  const fillColour = scene.mode === 'both' ? 'rgba(20,20,26,0.55)' : '#1b1c22';
  for (let x = t0 - (t0 % step); x <= t1; x += step) {
    const st = scene.status[x];
    if (st === TraceStatus.missing || st === TraceStatus.dead) continue;
    const cx = rect.left + (x + 0.5 - w.traceStart) * pxPerTrace;
    const base = x * scene.nSamples;
    // Positive lobes filled: polygon along max(0, v), closed on the baseline.
    ctx.beginPath();
    ctx.moveTo(cx, rect.top + (s0 + 0.5 - w.sampleStart) * pxPerSample);
    for (let s = s0; s <= s1; s += sStep) {
      const v = Math.min(limit, Math.max(0, scene.shown[base + s] * amp));
      ctx.lineTo(cx + v, rect.top + (s + 0.5 - w.sampleStart) * pxPerSample);
    }
    ctx.lineTo(cx, rect.top + (s1 + 0.5 - w.sampleStart) * pxPerSample);
    ctx.closePath();
    ctx.fillStyle = st === TraceStatus.filled ? 'rgba(18,120,104,0.75)' : fillColour;
    ctx.fill();
    ctx.beginPath();
    for (let s = s0; s <= s1; s += sStep) {
      const v = Math.min(limit, Math.max(-limit, scene.shown[base + s] * amp));
      const y = rect.top + (s + 0.5 - w.sampleStart) * pxPerSample;
      if (s === s0) ctx.moveTo(cx + v, y);
      else ctx.lineTo(cx + v, y);
    }
    ctx.strokeStyle = st === TraceStatus.filled ? '#127868' : '#1b1c22';
    ctx.lineWidth = 0.8;
    ctx.stroke();
  }
  return step;
}

/** Short strokes along the local slope on a regular screen grid; faded where confidence is low. */
function drawStrokes(ctx: CanvasRenderingContext2D, rect: PlotRect, scene: SectionScene): number {
  const s = scene.strokes!;
  const w = scene.window;
  const pxPerTrace = rect.width / (w.traceEnd - w.traceStart);
  const pxPerSample = rect.height / (w.sampleEnd - w.sampleStart);
  const spacing = 26;
  const half = 9;
  let n = 0;
  ctx.lineWidth = 1.6;
  ctx.lineCap = 'round';
  for (let py = rect.top + spacing / 2; py < rect.top + rect.height; py += spacing) {
    for (let px = rect.left + spacing / 2; px < rect.left + rect.width; px += spacing) {
      const x = Math.floor(w.traceStart + (px - rect.left) / pxPerTrace);
      const t = Math.floor(w.sampleStart + (py - rect.top) / pxPerSample);
      if (x < 0 || x >= scene.nTraces || t < 0 || t >= scene.nSamples) continue;
      const i = x * scene.nSamples + t;
      const slope = s.slope[i];
      const c = s.confidence ? s.confidence[i] : 1;
      // Screen direction of "one trace across, slope samples down".
      const dx = pxPerTrace;
      const dy = slope * pxPerSample;
      const len = Math.hypot(dx, dy) || 1;
      const ux = (dx / len) * half;
      const uy = (dy / len) * half;
      ctx.strokeStyle = `rgba(24,16,60,${(0.25 + 0.7 * c).toFixed(2)})`;
      ctx.setLineDash(c < 0.35 ? [2, 3] : []);
      ctx.beginPath();
      ctx.moveTo(px - ux, py - uy);
      ctx.lineTo(px + ux, py + uy);
      ctx.stroke();
      n++;
    }
  }
  ctx.setLineDash([]);
  return n;
}

/** Diagonal hatch over missing runs, in screen space: "nothing recorded here" at any zoom and in grey print. */
function drawMissingHatch(ctx: CanvasRenderingContext2D, rect: PlotRect, scene: SectionScene, fillGround: boolean): void {
  const w = scene.window;
  const top = rect.top;
  const bottom = rect.top + rect.height;
  for (const [a, b] of runsOf(scene.status, [TraceStatus.missing])) {
    const x0 = Math.max(rect.left, dataToScreen(w, rect, a, 0).x);
    const x1 = Math.min(rect.left + rect.width, dataToScreen(w, rect, b + 1, 0).x);
    if (x1 <= x0) continue;
    ctx.save();
    ctx.beginPath();
    ctx.rect(x0, top, x1 - x0, bottom - top);
    ctx.clip();
    if (fillGround) {
      ctx.fillStyle = '#f6e2c4';
      ctx.fillRect(x0, top, x1 - x0, bottom - top);
    }
    ctx.strokeStyle = 'rgba(214,140,50,0.75)';
    ctx.lineWidth = 1.5;
    ctx.beginPath();
    const h = bottom - top;
    for (let x = x0 - h; x < x1; x += 9) {
      ctx.moveTo(x, bottom);
      ctx.lineTo(x + h, top);
    }
    ctx.stroke();
    ctx.restore();
  }
}

function drawFilledBrackets(ctx: CanvasRenderingContext2D, rect: PlotRect, scene: SectionScene): void {
  const w = scene.window;
  ctx.strokeStyle = STATUS_STYLES[TraceStatus.filled].colour;
  ctx.lineWidth = 1.5;
  ctx.setLineDash([6, 4]);
  // Runs of 2 or more only: around single filled traces (decimation) the lines would stripe the whole section;
  // those are marked in the strip and by their teal wiggles.
  for (const [a, b] of runsOf(scene.status, [TraceStatus.filled])) {
    if (b === a) continue;
    for (const edge of [a, b + 1]) {
      const { x } = dataToScreen(w, rect, edge, 0);
      if (x < rect.left - 1 || x > rect.left + rect.width + 1) continue;
      ctx.beginPath();
      ctx.moveTo(x, rect.top);
      ctx.lineTo(x, rect.top + rect.height);
      ctx.stroke();
    }
  }
  // Traces marked bad keep showing their (bad) data, framed in magenta dots until the fill replaces them.
  ctx.strokeStyle = STATUS_STYLES[TraceStatus.markedBad].colour;
  ctx.setLineDash([2, 3]);
  for (const [a, b] of runsOf(scene.status, [TraceStatus.markedBad])) {
    for (const edge of [a, b + 1]) {
      const { x } = dataToScreen(w, rect, edge, 0);
      if (x < rect.left - 1 || x > rect.left + rect.width + 1) continue;
      ctx.beginPath();
      ctx.moveTo(x, rect.top);
      ctx.lineTo(x, rect.top + rect.height);
      ctx.stroke();
    }
  }
  ctx.setLineDash([]);
}

function drawStatusStrip(ctx: CanvasRenderingContext2D, rect: PlotRect, scene: SectionScene): void {
  const w = scene.window;
  const top = rect.top - STRIP_HEIGHT - 1;
  const pxPerTrace = rect.width / (w.traceEnd - w.traceStart);
  const t0 = Math.max(0, Math.floor(w.traceStart));
  const t1 = Math.min(scene.nTraces - 1, Math.ceil(w.traceEnd));
  for (let x = t0; x <= t1; x++) {
    const st = scene.status[x] as TraceStatusCode;
    const style = STATUS_STYLES[st];
    const left = rect.left + (x - w.traceStart) * pxPerTrace;
    const l = Math.max(rect.left, left);
    const r = Math.min(rect.left + rect.width, left + pxPerTrace);
    if (r <= l) continue;
    ctx.fillStyle = style.colour;
    if (st === TraceStatus.live) {
      ctx.fillRect(l, top + STRIP_HEIGHT - 3, r - l, 3);
    } else if (st === TraceStatus.filled) {
      ctx.fillRect(l, top, r - l, STRIP_HEIGHT);
    } else if (st === TraceStatus.missing) {
      ctx.fillRect(l, top + 3, r - l, STRIP_HEIGHT - 3);
    } else {
      ctx.fillRect(l, top, r - l, STRIP_HEIGHT);
      if (r - l > 5) {
        ctx.strokeStyle = '#fff';
        ctx.lineWidth = 1;
        ctx.beginPath();
        ctx.moveTo(l + 1, top + 2);
        ctx.lineTo(r - 1, top + STRIP_HEIGHT - 2);
        ctx.moveTo(r - 1, top + 2);
        ctx.lineTo(l + 1, top + STRIP_HEIGHT - 2);
        ctx.stroke();
      }
    }
  }
}

function formatTick(v: number, step: number): string {
  const digits = step >= 1 ? 0 : Math.min(4, Math.ceil(-Math.log10(step)));
  return v.toFixed(digits);
}

function drawAxes(ctx: CanvasRenderingContext2D, rect: PlotRect, scene: SectionScene): void {
  const w = scene.window;
  ctx.fillStyle = '#2a2c33';
  ctx.strokeStyle = '#2a2c33';
  ctx.lineWidth = 1;
  ctx.font = '11px system-ui, sans-serif';
  ctx.strokeRect(rect.left - 0.5, rect.top - 0.5, rect.width + 1, rect.height + 1);
  // Time axis (left), in ms, increasing downwards.
  const dtMs = scene.dtSeconds * 1000;
  const tStartMs = w.sampleStart * dtMs;
  const tEndMs = w.sampleEnd * dtMs;
  const tStep = niceStep(tEndMs - tStartMs, rect.height / 45);
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (let v = Math.ceil(tStartMs / tStep) * tStep; v <= tEndMs; v += tStep) {
    const y = rect.top + ((v / dtMs - w.sampleStart) / (w.sampleEnd - w.sampleStart)) * rect.height;
    ctx.beginPath();
    ctx.moveTo(rect.left - 5, y);
    ctx.lineTo(rect.left, y);
    ctx.stroke();
    ctx.fillText(formatTick(v, tStep), rect.left - 7, y);
  }
  ctx.save();
  ctx.translate(13, rect.top + rect.height / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textAlign = 'center';
  ctx.fillText('two-way time (ms) ↓', 0, 0);
  ctx.restore();
  // Position axis (top): label values at trace centres.
  const labels = scene.positionLabels;
  const pxPerTrace = rect.width / (w.traceEnd - w.traceStart);
  const traceStep = Math.max(1, Math.round(niceStep(w.traceEnd - w.traceStart, rect.width / 70)));
  ctx.textAlign = 'center';
  ctx.textBaseline = 'bottom';
  const axisY = rect.top - STRIP_HEIGHT - 3;
  for (let x = Math.ceil(w.traceStart / traceStep) * traceStep; x < w.traceEnd; x += traceStep) {
    if (x >= scene.nTraces) break;
    const px = rect.left + (x + 0.5 - w.traceStart) * pxPerTrace;
    ctx.beginPath();
    ctx.moveTo(px, axisY);
    ctx.lineTo(px, axisY + 3);
    ctx.stroke();
    const v = labels ? labels[x] : x + 1;
    ctx.fillText(Number.isFinite(v) ? (Math.abs(v) >= 100 ? v.toFixed(0) : String(Math.round(v * 10) / 10)) : '—', px, axisY - 1);
  }
  ctx.textAlign = 'left';
  ctx.textBaseline = 'top';
  ctx.fillText(`${scene.positionTitle} →`, rect.left, 2);
}
