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

/** Circular mean of the fractional parts of x_i (in cycles), so one jittered trace cannot set the grid's phase. */
function gridPhase(positionsM: Float64Array, originM: number, step: number): number {
  let c = 0, sn = 0;
  for (const p of positionsM) {
    const a = 2 * Math.PI * ((p - originM) / step);
    c += Math.cos(a);
    sn += Math.sin(a);
  }
  return Math.atan2(sn, c) / (2 * Math.PI);
}

interface GridFit {
  readonly k: Int32Array;
  readonly spacingM: number;
  readonly originM: number;
  /** Largest |position − grid position| / spacing. */
  readonly maxDev: number;
  /** No two traces share a grid index. */
  readonly unique: boolean;
}

/**
 * Put the traces on a grid of about `step`: phase from all traces, then (when `refine`) a least-squares line
 * through (grid index, position), twice, so neither one jittered trace nor a slightly wrong step moves it.
 */
function fitGrid(positionsM: Float64Array, pmin: number, step: number, refine: boolean): GridFit {
  const n = positionsM.length;
  const k = new Int32Array(n);
  let spacing = step;
  let origin = pmin + gridPhase(positionsM, pmin, step) * step;
  const assign = (): number => {
    let kmin = Infinity;
    for (let i = 0; i < n; i++) { k[i] = Math.round((positionsM[i] - origin) / spacing); if (k[i] < kmin) kmin = k[i]; }
    for (let i = 0; i < n; i++) k[i] -= kmin;
    origin += kmin * spacing;
    let dev = 0;
    for (let i = 0; i < n; i++) dev = Math.max(dev, Math.abs(positionsM[i] - origin - k[i] * spacing) / spacing);
    return dev;
  };
  let maxDev = assign();
  // Exact grids keep their exact step; otherwise polish step and origin by least squares (twice).
  for (let pass = 0; refine && n >= 3 && maxDev > 1e-9 && pass < 2; pass++) {
    let sk = 0, sp = 0, skk = 0, skp = 0;
    for (let i = 0; i < n; i++) { sk += k[i]; sp += positionsM[i]; skk += k[i] * k[i]; skp += k[i] * positionsM[i]; }
    const den = n * skk - sk * sk;
    const s = den > 0 ? (n * skp - sk * sp) / den : 0;
    if (!(s > 0)) break;
    spacing = s;
    origin = (sp - s * sk) / n;
    maxDev = assign();
  }
  const seen = new Set<number>();
  for (let i = 0; i < n; i++) seen.add(k[i]);
  return { k, spacingM: spacing, originM: origin, maxDev, unique: seen.size === n };
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
    // of the median step on which every trace sits. A spacing the user gives is kept as given.
    let fit: GridFit;
    if (userSpacing !== undefined) fit = fitGrid(positionsM, pmin, userSpacing, false);
    else {
      // A finer grid (m/d) must fit clearly better than the median step's (half the deviation or less) with a
      // step within 1% of m/d: jitter alone must not halve the spacing, a trace between two median-grid
      // positions does.
      const m = median(steps);
      const first = fitGrid(positionsM, pmin, m, nTraces > 2);
      let best: GridFit | undefined = first.unique && first.maxDev <= tol ? first : undefined;
      for (let d = 2; d <= MAX_STEP_DIVISOR; d++) {
        const f = fitGrid(positionsM, pmin, m / d, nTraces > 2);
        // The polish may not wander from m/d: with more grid positions than traces, a free fit matches anything.
        if (!f.unique || f.maxDev > tol || Math.abs(f.spacingM - m / d) > 0.01 * (m / d)) continue;
        if (!best) { best = f; break; }
        if (f.maxDev <= 0.5 * best.maxDev) { best = f; break; }
      }
      fit = best ?? first;
    }
    const step0 = fit.spacingM;
    gridIndexOfTrace.set(fit.k);
    spacingM = fit.spacingM;
    originM = fit.originM;
    maxJitter = fit.maxDev;
    gridCount = 0;
    for (let i = 0; i < nTraces; i++) gridCount = Math.max(gridCount, gridIndexOfTrace[i] + 1);
    if (gridCount > MAX_GRID_PER_TRACE * nTraces + 100)
      throw irregular('the trace positions do not form a regular line: the grid would be far larger than the gather.',
        `${nTraces} traces spanning ${(pmax - pmin).toFixed(2)} m with a median step of ${step0.toFixed(3)} m (${gridCount} grid positions)`,
        'Choose another gather key, or give the spacing explicitly.');
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
