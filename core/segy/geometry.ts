/**
 * Gather geometry: each trace's position along the line, the regular spacing, each trace's index on the
 * regular grid, and which grid positions are missing (no trace) or dead (trace ID code 2, or all samples 0).
 *
 * Positions come from whichever header values vary within the gather: receiver coordinates (shot gather),
 * source coordinates (receiver gather), the offset (CMP gather, where both vary), else trace order with a
 * spacing the user gives (files without geometry, such as WL1.sgy). Layout of `data`: core/grid/gather.ts.
 */
import { InputFileError, type FileProblem } from '../problems';
import type { TraceHeader } from './trace-header';

export type PositionSource = 'receiver' | 'source' | 'offset' | 'trace-order';

export interface GeometryOptions {
  /** Grid spacing in metres. Required for a spacing where headers carry none; overrides the estimate otherwise. */
  readonly spacingM?: number;
  /** Largest allowed |position − grid position| / spacing before a warning (default 0.35). */
  readonly jitterTolerance?: number;
}

export interface GatherGeometry {
  /** Position of each trace along the line in metres (gather order); NaN when unknown (trace order, no spacing). */
  readonly positionsM: Float64Array;
  readonly positionSource: PositionSource;
  /** Regular grid spacing in metres; NaN when unknown. */
  readonly spacingM: number;
  /** Position of grid index 0 in metres (NaN when unknown). */
  readonly originM: number;
  readonly gridIndexOfTrace: Int32Array;
  readonly gridCount: number;
  /** Trace (gather order) at each grid position, −1 where none. */
  readonly traceOfGrid: Int32Array;
  /** Grid positions without a trace. */
  readonly missingGrid: Int32Array;
  /** Grid positions whose trace is dead (ID code 2, or every sample 0). */
  readonly deadGrid: Int32Array;
  /** Largest |position − grid position| / spacing (0 for trace order). */
  readonly maxJitter: number;
  readonly warnings: readonly FileProblem[];
}

/** Earth radius for converting geographic coordinates to local metres (mean radius, IUGG; from memory). */
const EARTH_RADIUS_M = 6_371_000;
/** A gather may hold at most this many grid positions per trace before its geometry is called irregular. */
const MAX_GRID_PER_TRACE = 20;

function dmsToDegrees(v: number): number {
  // DDDMMSS.ss (SEG-Y rev 1, coordinate units 4; from memory).
  const sign = v < 0 ? -1 : 1;
  const a = Math.abs(v);
  const d = Math.floor(a / 10000);
  const m = Math.floor((a - d * 10000) / 100);
  const s = a - d * 10000 - m * 100;
  return sign * (d + m / 60 + s / 3600);
}

/** Convert header coordinates to local metres (x east, y north). Lengths are already metres. */
function toLocalMetres(xs: Float64Array, ys: Float64Array, unit: TraceHeader['coordinateUnit']): void {
  if (unit === 'length' || unit === 'unspecified') return;
  const toDeg = unit === 'arc-seconds' ? (v: number) => v / 3600 : unit === 'dms' ? dmsToDegrees : (v: number) => v;
  const lat0 = (toDeg(ys[0]) * Math.PI) / 180;
  const k = (EARTH_RADIUS_M * Math.PI) / 180;
  const x0 = toDeg(xs[0]);
  const y0 = toDeg(ys[0]);
  for (let i = 0; i < xs.length; i++) {
    // Equirectangular approximation: adequate over the few kilometres of one gather.
    const lon = toDeg(xs[i]);
    const lat = toDeg(ys[i]);
    xs[i] = (lon - x0) * k * Math.cos(lat0);
    ys[i] = (lat - y0) * k;
  }
}

function range(a: Float64Array): number {
  let lo = Infinity, hi = -Infinity;
  for (const v of a) { if (v < lo) lo = v; if (v > hi) hi = v; }
  return hi - lo;
}

/** Distances along the principal direction of the points, increasing from the first trace to the last. */
function alongLine(xs: Float64Array, ys: Float64Array): Float64Array {
  const n = xs.length;
  let mx = 0, my = 0;
  for (let i = 0; i < n; i++) { mx += xs[i]; my += ys[i]; }
  mx /= n; my /= n;
  let sxx = 0, syy = 0, sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = xs[i] - mx, dy = ys[i] - my;
    sxx += dx * dx; syy += dy * dy; sxy += dx * dy;
  }
  const angle = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  let ux = Math.cos(angle), uy = Math.sin(angle);
  if ((xs[n - 1] - xs[0]) * ux + (ys[n - 1] - ys[0]) * uy < 0) { ux = -ux; uy = -uy; }
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = (xs[i] - xs[0]) * ux + (ys[i] - ys[0]) * uy;
  return out;
}

function median(values: number[]): number {
  const s = values.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

const MAX_STEP_DIVISOR = 8;

function fittingStep(positionsM: Float64Array, originM: number, medianStep: number, tol: number): number {
  for (let d = 1; d <= MAX_STEP_DIVISOR; d++) {
    const step = medianStep / d;
    let ok = true;
    for (const p of positionsM) {
      const x = (p - originM) / step;
      if (Math.abs(x - Math.round(x)) > tol) { ok = false; break; }
    }
    if (ok) return step;
  }
  return medianStep;
}

function irregular(message: string, found: string, hint: string): InputFileError {
  return new InputFileError({ code: 'geometry.irregular', severity: 'error', message, found, hint });
}

function isDeadTrace(h: TraceHeader, data: Float32Array, trace: number, nSamples: number): boolean {
  if (h.traceIdCode === 2) return true;
  const base = trace * nSamples;
  for (let s = 0; s < nSamples; s++) if (data[base + s] !== 0) return false;
  return true;
}

export function gatherGeometry(headers: readonly TraceHeader[], data: Float32Array, nSamples: number, options: GeometryOptions = {}): GatherGeometry {
  const nTraces = headers.length;
  if (data.length !== nTraces * nSamples) throw new RangeError(`data length ${data.length} is not nTraces·nSamples = ${nTraces}·${nSamples}`);
  const userSpacing = options.spacingM;
  if (userSpacing !== undefined && !(userSpacing > 0 && Number.isFinite(userSpacing)))
    throw new InputFileError({ code: 'input.bad-argument', severity: 'error', message: 'the trace spacing must be a positive number of metres.', found: userSpacing });
  const warnings: FileProblem[] = [];
  const tol = options.jitterTolerance ?? 0.35;

  // Which header values vary within the gather?
  const sx = new Float64Array(nTraces), sy = new Float64Array(nTraces), rx = new Float64Array(nTraces), ry = new Float64Array(nTraces);
  const off = new Float64Array(nTraces);
  for (let i = 0; i < nTraces; i++) {
    const h = headers[i];
    sx[i] = h.sourceX; sy[i] = h.sourceY; rx[i] = h.receiverX; ry[i] = h.receiverY; off[i] = h.offsetM;
  }
  const unit = nTraces ? headers[0].coordinateUnit : 'length';
  toLocalMetres(sx, sy, unit);
  toLocalMetres(rx, ry, unit);
  const varies = (a: Float64Array, b?: Float64Array) => range(a) > 1e-3 || (b !== undefined && range(b) > 1e-3);
  const rv = nTraces > 1 && varies(rx, ry);
  const sv = nTraces > 1 && varies(sx, sy);
  const ov = nTraces > 1 && varies(off);
  let positionSource: PositionSource;
  let positionsM: Float64Array;
  if (rv && !sv) { positionSource = 'receiver'; positionsM = alongLine(rx, ry); }
  else if (sv && !rv) { positionSource = 'source'; positionsM = alongLine(sx, sy); }
  else if (rv && sv && !ov) { positionSource = 'receiver'; positionsM = alongLine(rx, ry); }
  else if (ov) { positionSource = 'offset'; positionsM = off; }
  else {
    positionSource = 'trace-order';
    positionsM = new Float64Array(nTraces);
    for (let i = 0; i < nTraces; i++) positionsM[i] = userSpacing !== undefined ? i * userSpacing : Number.NaN;
  }

  const gridIndexOfTrace = new Int32Array(nTraces);
  let spacingM: number;
  let originM: number;
  let gridCount: number;
  let maxJitter = 0;
  if (positionSource === 'trace-order') {
    for (let i = 0; i < nTraces; i++) gridIndexOfTrace[i] = i;
    gridCount = nTraces;
    spacingM = userSpacing ?? Number.NaN;
    originM = userSpacing !== undefined ? 0 : Number.NaN;
    if (userSpacing === undefined && nTraces > 1)
      warnings.push({
        code: 'geometry.no-spacing', severity: 'warning',
        message: 'the trace headers carry no geometry (coordinates and offsets do not vary); traces are placed in file order, one grid position each.',
        hint: 'Give the trace spacing in metres to place them on a physical axis.',
      });
  } else {
    let pmin = Infinity, pmax = -Infinity;
    for (const p of positionsM) { if (p < pmin) pmin = p; if (p > pmax) pmax = p; }
    const sorted = Array.from(positionsM).sort((a, b) => a - b);
    const eps = 1e-4; // 0.1 mm: repeated positions are not steps
    const steps: number[] = [];
    for (let i = 1; i < sorted.length; i++) if (sorted[i] - sorted[i - 1] > eps) steps.push(sorted[i] - sorted[i - 1]);
    // Median step: robust to gaps (a gap is one long step) and to jitter. When some traces sit between the
    // median grid's positions (decimated data with a few full-rate traces), take the largest whole fraction
    // of the median step on which every trace sits.
    const step0 = userSpacing ?? fittingStep(positionsM, pmin, median(steps), tol);
    for (let i = 0; i < nTraces; i++) gridIndexOfTrace[i] = Math.round((positionsM[i] - pmin) / step0);
    spacingM = step0;
    originM = pmin;
    if (userSpacing === undefined && nTraces > 2) {
      // Least-squares line through (grid index, position): a spacing and origin free of the first trace's jitter.
      let sk = 0, sp = 0, skk = 0, skp = 0;
      for (let i = 0; i < nTraces; i++) {
        const k = gridIndexOfTrace[i], p = positionsM[i];
        sk += k; sp += p; skk += k * k; skp += k * p;
      }
      const den = nTraces * skk - sk * sk;
      if (den > 0) {
        spacingM = (nTraces * skp - sk * sp) / den;
        originM = (sp - spacingM * sk) / nTraces;
      }
    }
    gridCount = 0;
    for (let i = 0; i < nTraces; i++) gridCount = Math.max(gridCount, gridIndexOfTrace[i] + 1);
    if (gridCount > MAX_GRID_PER_TRACE * nTraces + 100)
      throw irregular('the trace positions do not form a regular line: the grid would be far larger than the gather.',
        `${nTraces} traces spanning ${(pmax - pmin).toFixed(2)} m with a median step of ${step0.toFixed(3)} m (${gridCount} grid positions)`,
        'Choose another gather key, or give the spacing explicitly.');
    for (let i = 0; i < nTraces; i++) {
      const j = Math.abs(positionsM[i] - (originM + gridIndexOfTrace[i] * spacingM)) / spacingM;
      if (j > maxJitter) maxJitter = j;
    }
    if (maxJitter > tol)
      warnings.push({
        code: 'geometry.irregular', severity: 'warning',
        message: 'some traces sit far from the regular grid.', found: `${(maxJitter * 100).toFixed(0)}% of the spacing`,
        expected: `at most ${(tol * 100).toFixed(0)}%`,
      });
  }

  const traceOfGrid = new Int32Array(gridCount).fill(-1);
  for (let i = 0; i < nTraces; i++) {
    const k = gridIndexOfTrace[i];
    if (traceOfGrid[k] >= 0)
      throw irregular('two traces of the gather fall on the same grid position.',
        `traces ${traceOfGrid[k]} and ${i} of the gather at ${positionsM[traceOfGrid[k]].toFixed(2)} m and ${positionsM[i].toFixed(2)} m (${positionSource} positions, spacing ${spacingM.toFixed(3)} m)`,
        'The gather may hold repeated traces or a split spread with unsigned offsets; choose another key or give a finer spacing.');
    traceOfGrid[k] = i;
  }
  const missing: number[] = [];
  const dead: number[] = [];
  for (let k = 0; k < gridCount; k++) {
    const t = traceOfGrid[k];
    if (t < 0) missing.push(k);
    else if (isDeadTrace(headers[t], data, t, nSamples)) dead.push(k);
  }
  return {
    positionsM, positionSource, spacingM, originM, gridIndexOfTrace, gridCount, traceOfGrid,
    missingGrid: Int32Array.from(missing), deadGrid: Int32Array.from(dead), maxJitter, warnings,
  };
}
