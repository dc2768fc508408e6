/**
 * Hand edits of the dip field: plain JSON-serialisable data kept apart from the estimate (recipes store them;
 * the UI keeps an ordered list for undo/redo). Applying an ordered list to an estimated field gives the final
 * field; edits always win, and re-estimation never erases them because they are re-applied to each new
 * estimate. Coordinates are fine-grid trace index and time sample (fractional allowed); slopes in samples per
 * trace (convert with core/slope/units.ts). Edits act on the pair grid (a pair p sits at trace position p+½).
 * Kinds:
 *  - brush: a stroke (polyline) with radius in traces and samples and a soft edge; sets or adds a slope.
 *  - region: a polygon; sets a slope inside, or smooths the field inside.
 *  - link: an event picked on each side of a gap; between them the slope follows the cubic Hermite path through
 *    both picks with end slopes read from the field just outside the picks (methods.md §3.5), in a band of
 *    ±halfWidthSamples around the path with a soft edge.
 */
import { InputFileError } from '../problems';
import { createTriangle2D, triangle2DApply } from './triangle';

export interface DipPoint {
  /** Fine-grid trace index (fractional allowed). */
  readonly trace: number;
  /** Time sample index (fractional allowed). */
  readonly sample: number;
}

export interface BrushEdit {
  readonly kind: 'brush';
  readonly mode: 'set' | 'add';
  readonly slopeSamplesPerTrace: number;
  readonly points: readonly DipPoint[];
  readonly radiusTraces: number;
  readonly radiusSamples: number;
  /** Fraction of the radius over which the weight tapers from 1 to 0 (0 hard edge, 1 fully soft). */
  readonly softness: number;
}

export interface RegionEdit {
  readonly kind: 'region';
  readonly polygon: readonly DipPoint[];
  readonly action: 'set' | 'smooth';
  /** For 'set'. */
  readonly slopeSamplesPerTrace?: number;
  /** For 'smooth' (defaults 5 traces, 10 samples). */
  readonly radiusTraces?: number;
  readonly radiusSamples?: number;
}

export interface LinkEdit {
  readonly kind: 'link';
  readonly from: DipPoint;
  readonly to: DipPoint;
  /** Half-width of the band that follows the path, samples (default 8). */
  readonly halfWidthSamples?: number;
  /** End slopes; read from the field when absent. */
  readonly fromSlope?: number;
  readonly toSlope?: number;
}

export type DipEdit = BrushEdit | RegionEdit | LinkEdit;

function bad(index: number, message: string, found: unknown): InputFileError {
  return new InputFileError({
    code: 'input.bad-dips', severity: 'error', field: `edit ${index + 1}`, message,
    found: typeof found === 'string' ? found : JSON.stringify(found),
    hint: 'Each dip edit is a brush, region or link with finite coordinates; see docs/slopes.md.',
  });
}

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const isPoint = (p: unknown): p is DipPoint => !!p && typeof p === 'object' && finite((p as DipPoint).trace) && finite((p as DipPoint).sample);

/** Validates an edit list read from JSON (a recipe, IPC). Throws InputFileError input.bad-dips. */
export function validateDipEdits(edits: unknown): readonly DipEdit[] {
  if (!Array.isArray(edits)) throw bad(-1, 'dip edits must be a list.', edits);
  edits.forEach((e: unknown, i) => {
    if (!e || typeof e !== 'object') throw bad(i, 'an edit must be an object.', e);
    const k = (e as { kind?: unknown }).kind;
    if (k === 'brush') {
      const b = e as BrushEdit;
      if (b.mode !== 'set' && b.mode !== 'add') throw bad(i, 'brush mode must be "set" or "add".', b.mode);
      if (!finite(b.slopeSamplesPerTrace)) throw bad(i, 'brush slope must be a finite number.', b.slopeSamplesPerTrace);
      if (!Array.isArray(b.points) || b.points.length === 0 || !b.points.every(isPoint)) throw bad(i, 'brush needs at least one point {trace, sample}.', b.points);
      if (!finite(b.radiusTraces) || b.radiusTraces <= 0 || !finite(b.radiusSamples) || b.radiusSamples <= 0) throw bad(i, 'brush radii must be > 0.', [b.radiusTraces, b.radiusSamples]);
      if (!finite(b.softness) || b.softness < 0 || b.softness > 1) throw bad(i, 'brush softness must be in [0, 1].', b.softness);
    } else if (k === 'region') {
      const r = e as RegionEdit;
      if (!Array.isArray(r.polygon) || r.polygon.length < 3 || !r.polygon.every(isPoint)) throw bad(i, 'region needs a polygon of at least 3 points.', r.polygon);
      if (r.action === 'set') {
        if (!finite(r.slopeSamplesPerTrace)) throw bad(i, 'region "set" needs a finite slope.', r.slopeSamplesPerTrace);
      } else if (r.action === 'smooth') {
        for (const v of [r.radiusTraces, r.radiusSamples]) if (v !== undefined && (!finite(v) || v < 1)) throw bad(i, 'region smoothing radii must be ≥ 1.', v);
      } else throw bad(i, 'region action must be "set" or "smooth".', r.action);
    } else if (k === 'link') {
      const l = e as LinkEdit;
      if (!isPoint(l.from) || !isPoint(l.to)) throw bad(i, 'link needs two points {trace, sample}.', [l.from, l.to]);
      if (Math.abs(l.to.trace - l.from.trace) < 1) throw bad(i, 'link ends must be at least one trace apart.', [l.from.trace, l.to.trace]);
      if (l.halfWidthSamples !== undefined && (!finite(l.halfWidthSamples) || l.halfWidthSamples <= 0)) throw bad(i, 'link half-width must be > 0.', l.halfWidthSamples);
      for (const v of [l.fromSlope, l.toSlope]) if (v !== undefined && !finite(v)) throw bad(i, 'link end slopes must be finite.', v);
    } else throw bad(i, 'edit kind must be "brush", "region" or "link".', k);
  });
  return edits as DipEdit[];
}

/** Cosine taper: 1 for d ≤ 1 − soft, 0 for d ≥ 1. */
export function softWeight(d: number, softness: number): number {
  if (d >= 1) return 0;
  const inner = 1 - softness;
  if (d <= inner) return 1;
  return 0.5 * (1 + Math.cos((Math.PI * (d - inner)) / softness));
}

function segmentDistance(px: number, pt: number, ax: number, at: number, bx: number, bt: number): number {
  const dx = bx - ax, dt = bt - at;
  const len2 = dx * dx + dt * dt;
  let f = len2 > 0 ? ((px - ax) * dx + (pt - at) * dt) / len2 : 0;
  f = f < 0 ? 0 : f > 1 ? 1 : f;
  const ex = px - (ax + f * dx), et = pt - (at + f * dt);
  return Math.sqrt(ex * ex + et * et);
}

function applyBrush(sigma: Float64Array, weight: Float64Array, nPairs: number, ns: number, b: BrushEdit): void {
  // Work in radius-normalised coordinates so the brush is an ellipse.
  const pts = b.points.map((p) => [p.trace / b.radiusTraces, p.sample / b.radiusSamples] as const);
  let x0 = Infinity, x1 = -Infinity, t0 = Infinity, t1 = -Infinity;
  for (const p of b.points) {
    x0 = Math.min(x0, p.trace - b.radiusTraces); x1 = Math.max(x1, p.trace + b.radiusTraces);
    t0 = Math.min(t0, p.sample - b.radiusSamples); t1 = Math.max(t1, p.sample + b.radiusSamples);
  }
  const pLo = Math.max(0, Math.floor(x0 - 0.5)), pHi = Math.min(nPairs - 1, Math.ceil(x1 - 0.5));
  const tLo = Math.max(0, Math.floor(t0)), tHi = Math.min(ns - 1, Math.ceil(t1));
  for (let p = pLo; p <= pHi; p++) {
    const xn = (p + 0.5) / b.radiusTraces;
    for (let t = tLo; t <= tHi; t++) {
      const tn = t / b.radiusSamples;
      let d = Infinity;
      if (pts.length === 1) d = Math.hypot(xn - pts[0][0], tn - pts[0][1]);
      else for (let s = 0; s + 1 < pts.length; s++) d = Math.min(d, segmentDistance(xn, tn, pts[s][0], pts[s][1], pts[s + 1][0], pts[s + 1][1]));
      const w = softWeight(d, b.softness);
      if (w <= 0) continue;
      const i = p * ns + t;
      sigma[i] = b.mode === 'set' ? (1 - w) * sigma[i] + w * b.slopeSamplesPerTrace : sigma[i] + w * b.slopeSamplesPerTrace;
      if (w > weight[i]) weight[i] = w;
    }
  }
}

/** Even-odd rule point-in-polygon test. */
export function insidePolygon(x: number, t: number, poly: readonly DipPoint[]): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const xi = poly[i].trace, ti = poly[i].sample, xj = poly[j].trace, tj = poly[j].sample;
    if (ti > t !== tj > t && x < ((xj - xi) * (t - ti)) / (tj - ti) + xi) inside = !inside;
  }
  return inside;
}

function applyRegion(sigma: Float64Array, weight: Float64Array, nPairs: number, ns: number, r: RegionEdit): void {
  let smoothed: Float64Array | null = null;
  if (r.action === 'smooth') {
    // Normalised triangle smoothing (divide by the smoothed ones) so the field's level is kept at the edges.
    const tri = createTriangle2D(nPairs, ns, Math.round(r.radiusSamples ?? 10), Math.round(r.radiusTraces ?? 5));
    smoothed = triangle2DApply(tri, new Float64Array(sigma.length), sigma);
    const ones = triangle2DApply(tri, new Float64Array(sigma.length), new Float64Array(sigma.length).fill(1));
    for (let i = 0; i < smoothed.length; i++) smoothed[i] /= ones[i];
  }
  let x0 = Infinity, x1 = -Infinity, t0 = Infinity, t1 = -Infinity;
  for (const p of r.polygon) {
    x0 = Math.min(x0, p.trace); x1 = Math.max(x1, p.trace); t0 = Math.min(t0, p.sample); t1 = Math.max(t1, p.sample);
  }
  for (let p = Math.max(0, Math.floor(x0 - 0.5)); p <= Math.min(nPairs - 1, Math.ceil(x1)); p++) {
    for (let t = Math.max(0, Math.floor(t0)); t <= Math.min(ns - 1, Math.ceil(t1)); t++) {
      if (!insidePolygon(p + 0.5, t, r.polygon)) continue;
      const i = p * ns + t;
      sigma[i] = smoothed ? smoothed[i] : (r.slopeSamplesPerTrace as number);
      weight[i] = 1;
    }
  }
}

/** σ at a fractional time in pair column p (linear in t, clamped). */
function sampleColumn(sigma: Float64Array, ns: number, p: number, t: number): number {
  const tc = t < 0 ? 0 : t > ns - 1 ? ns - 1 : t;
  const j = Math.min(ns - 2, Math.floor(tc));
  if (ns < 2) return sigma[p * ns];
  const f = tc - j;
  return sigma[p * ns + j] * (1 - f) + sigma[p * ns + j + 1] * f;
}

/** The Hermite path of a link: time and slope at trace position x (between the ends). */
export function linkPath(a: DipPoint, b: DipPoint, slopeA: number, slopeB: number, x: number): { sample: number; slope: number } {
  const D = b.trace - a.trace;
  const xi = (x - a.trace) / D;
  const xi2 = xi * xi, xi3 = xi2 * xi;
  const t = (2 * xi3 - 3 * xi2 + 1) * a.sample + (xi3 - 2 * xi2 + xi) * D * slopeA + (-2 * xi3 + 3 * xi2) * b.sample + (xi3 - xi2) * D * slopeB;
  const dt = (6 * xi2 - 6 * xi) * a.sample + (3 * xi2 - 4 * xi + 1) * D * slopeA + (-6 * xi2 + 6 * xi) * b.sample + (3 * xi2 - 2 * xi) * D * slopeB;
  return { sample: t, slope: dt / D };
}

function applyLink(sigma: Float64Array, weight: Float64Array, nPairs: number, ns: number, l: LinkEdit): void {
  const [a, b] = l.from.trace <= l.to.trace ? [l.from, l.to] : [l.to, l.from];
  const [sa0, sb0] = l.from.trace <= l.to.trace ? [l.fromSlope, l.toSlope] : [l.toSlope, l.fromSlope];
  // End slopes from the pair just outside each pick (the side away from the gap).
  const pa = Math.max(0, Math.min(nPairs - 1, Math.round(a.trace) - 1));
  const pb = Math.max(0, Math.min(nPairs - 1, Math.round(b.trace)));
  const slopeA = sa0 ?? sampleColumn(sigma, ns, pa, a.sample);
  const slopeB = sb0 ?? sampleColumn(sigma, ns, pb, b.sample);
  const hw = l.halfWidthSamples ?? 8;
  for (let p = Math.max(0, Math.ceil(a.trace - 0.5)); p <= Math.min(nPairs - 1, Math.floor(b.trace - 0.5)); p++) {
    const { sample: tc, slope: sc } = linkPath(a, b, slopeA, slopeB, p + 0.5);
    for (let t = Math.max(0, Math.ceil(tc - hw)); t <= Math.min(ns - 1, Math.floor(tc + hw)); t++) {
      const w = softWeight(Math.abs(t - tc) / hw, 0.5);
      if (w <= 0) continue;
      const i = p * ns + t;
      sigma[i] = (1 - w) * sigma[i] + w * sc;
      if (w > weight[i]) weight[i] = w;
    }
  }
}

/**
 * Applies an ordered edit list to a pair-grid slope field in place; weightOut (pair grid) receives the
 * largest edit weight per sample. Edits outside the grid are clipped. @returns sigmaPairs
 */
export function applyDipEdits(sigmaPairs: Float64Array, weightOut: Float64Array, nTraces: number, nSamples: number, edits: readonly DipEdit[]): Float64Array {
  const nPairs = nTraces - 1;
  if (sigmaPairs.length !== nPairs * nSamples || weightOut.length !== nPairs * nSamples)
    throw new RangeError(`applyDipEdits: field lengths ${sigmaPairs.length}, ${weightOut.length} ≠ (nTraces−1)*nSamples = ${nPairs * nSamples}`);
  validateDipEdits(edits);
  for (const e of edits) {
    if (e.kind === 'brush') applyBrush(sigmaPairs, weightOut, nPairs, nSamples, e);
    else if (e.kind === 'region') applyRegion(sigmaPairs, weightOut, nPairs, nSamples, e);
    else applyLink(sigmaPairs, weightOut, nPairs, nSamples, e);
  }
  return sigmaPairs;
}
