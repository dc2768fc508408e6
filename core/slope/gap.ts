/**
 * Slopes inside runs of missing traces, carried from the gap's edges ALONG EVENTS (methods.md §3.5, event-path
 * inpainting), not along time rows and not by smoothing toward zero.
 * For an interior gap with last live trace xL and first live trace xR (width D = xR − xL traces):
 *   edge slopes σL(t), σR(t) = confidence-weighted line fits over up to EDGE_COLUMNS live pair columns next to each
 *   edge, evaluated at the edge trace;
 *   from each left time tL: τ = D·(σL(tL) + σR(tL+τ))/2 (fixed point), tR = tL + τ;
 *   path t(ξ) = cubic Hermite with ends tL, tR and end slopes D·σL, D·σR (ξ = (x − xL)/D);
 *   slope along the path = t'(ξ)/D, splatted onto each gap pair column and interpolated in t.
 * Paths are seeded from both edges. A gap at the end of the gather is extrapolated along straight paths.
 * Confidence (heuristic, engineering choice, no source) = edge confidence
 *   × 1/(1 + (d/DISTANCE_SCALE_TRACES)²)   (d: distance to the nearest live trace)
 *   × 1/(1 + (D·|σL − σR|/8 / CURVATURE_SCALE_SAMPLES)²)   (D|σL−σR|/8 ≈ how far the path bends away from its chord).
 * Layout: σ and confidence on the pair grid (core/slope/pair-grid.ts), traceLive per trace.
 */

export const EDGE_COLUMNS = 3;
export const DISTANCE_SCALE_TRACES = 8;
export const CURVATURE_SCALE_SAMPLES = 1.5;
const SEED_STEP_SAMPLES = 0.5;

export interface TraceRun {
  /** First and last trace index of the run (inclusive). */
  readonly first: number;
  readonly last: number;
}

/** Maximal runs of traces with live = 0. */
export function findMissingRuns(traceLive: Uint8Array): TraceRun[] {
  const runs: TraceRun[] = [];
  let start = -1;
  for (let x = 0; x <= traceLive.length; x++) {
    const dead = x < traceLive.length && traceLive[x] === 0;
    if (dead && start < 0) start = x;
    if (!dead && start >= 0) {
      runs.push({ first: start, last: x - 1 });
      start = -1;
    }
  }
  return runs;
}

function interpColumn(col: Float64Array, t: number): number {
  const n = col.length;
  if (t <= 0) return col[0];
  if (t >= n - 1) return col[n - 1];
  const j = Math.floor(t);
  const f = t - j;
  return col[j] * (1 - f) + col[j + 1] * f;
}

/**
 * Edge profile from up to EDGE_COLUMNS live pair columns next to an edge (start, start+step, ...): per time row a
 * confidence-weighted straight-line fit across those columns, evaluated at the edge trace xEdge (the Hermite path
 * needs the slope AT the edge; a plain mean would sit 1.5 traces away). Confidence: plain mean.
 */
function edgeProfile(sigma: Float64Array, conf: Float64Array, pairLive: Uint8Array, start: number, step: number, nPairs: number, nSamples: number,
  xEdge: number, outS: Float64Array, outC: Float64Array): boolean {
  const cols: number[] = [];
  for (let q = start, k = 0; k < EDGE_COLUMNS && q >= 0 && q < nPairs && pairLive[q] === 1; q += step, k++) cols.push(q);
  if (cols.length === 0) return false;
  for (let t = 0; t < nSamples; t++) {
    let sw = 0, sx = 0, sy = 0, sxx = 0, sxy = 0, sc = 0;
    for (const q of cols) {
      const c = conf[q * nSamples + t];
      const w = c + 1e-3;
      const x = q + 0.5 - xEdge;
      const y = sigma[q * nSamples + t];
      sw += w; sx += w * x; sy += w * y; sxx += w * x * x; sxy += w * x * y;
      sc += c;
    }
    const mx = sx / sw, my = sy / sw;
    const vx = sxx / sw - mx * mx;
    const b = vx > 1e-9 ? (sxy / sw - mx * my) / vx : 0;
    outS[t] = my - b * mx; // value at x = xEdge
    outC[t] = sc / cols.length;
  }
  return true;
}

class ColumnSplat {
  readonly sumW: Float64Array;
  readonly sumS: Float64Array;
  readonly sumC: Float64Array;
  constructor(readonly nCols: number, readonly nSamples: number) {
    this.sumW = new Float64Array(nCols * nSamples);
    this.sumS = new Float64Array(nCols * nSamples);
    this.sumC = new Float64Array(nCols * nSamples);
  }
  /** Paths are weighted by (conf + 0.01)² so coherent events win where paths from quiet zones cross them. */
  add(col: number, t: number, slope: number, conf: number): void {
    const j = Math.floor(t);
    const cw = (conf + 0.01) * (conf + 0.01);
    const f = t - j;
    const base = col * this.nSamples;
    if (j >= 0 && j < this.nSamples) {
      const w = (1 - f) * cw;
      this.sumW[base + j] += w; this.sumS[base + j] += w * slope; this.sumC[base + j] += w * conf;
    }
    if (j + 1 >= 0 && j + 1 < this.nSamples) {
      const w = f * cw;
      this.sumW[base + j + 1] += w; this.sumS[base + j + 1] += w * slope; this.sumC[base + j + 1] += w * conf;
    }
  }
  /** Writes column col into sigma/conf at pair q, filling empty bins by linear interpolation in t. */
  resolve(col: number, sigma: Float64Array, conf: Float64Array, q: number): void {
    const ns = this.nSamples;
    const base = col * ns;
    const out = q * ns;
    let prev = -1;
    for (let t = 0; t <= ns; t++) {
      const filled = t < ns && this.sumW[base + t] > 1e-12;
      if (!filled && t < ns) continue;
      if (filled) {
        sigma[out + t] = this.sumS[base + t] / this.sumW[base + t];
        conf[out + t] = this.sumC[base + t] / this.sumW[base + t];
      }
      // fill the empty stretch (prev, t)
      const lo = prev, hi = t < ns ? t : -1;
      for (let k = prev + 1; k < (t < ns ? t : ns); k++) {
        if (lo < 0 && hi < 0) { sigma[out + k] = 0; conf[out + k] = 0; }
        else if (lo < 0) { sigma[out + k] = sigma[out + hi]; conf[out + k] = conf[out + hi]; }
        else if (hi < 0) { sigma[out + k] = sigma[out + lo]; conf[out + k] = conf[out + lo]; }
        else {
          const f = (k - lo) / (hi - lo);
          sigma[out + k] = sigma[out + lo] * (1 - f) + sigma[out + hi] * f;
          conf[out + k] = conf[out + lo] * (1 - f) + conf[out + hi] * f;
        }
      }
      prev = t;
    }
  }
}

/**
 * Replaces σ and confidence in every pair that touches a missing trace. Returns a pair-grid mask, 1 where
 * values were inpainted. In place; allocates per gap.
 */
export function inpaintGapSlopes(sigma: Float64Array, conf: Float64Array, traceLive: Uint8Array, nTraces: number, nSamples: number): Uint8Array {
  const nPairs = nTraces - 1;
  const ns = nSamples;
  const mask = new Uint8Array(nPairs * ns);
  const pairLive = new Uint8Array(nPairs);
  for (let p = 0; p < nPairs; p++) pairLive[p] = traceLive[p] && traceLive[p + 1] ? 1 : 0;
  const sL = new Float64Array(ns), cL = new Float64Array(ns), sR = new Float64Array(ns), cR = new Float64Array(ns);
  for (const run of findMissingRuns(traceLive)) {
    const qFirst = Math.max(0, run.first - 1);
    const qLast = Math.min(nPairs - 1, run.last);
    if (qLast < qFirst) continue;
    const nCols = qLast - qFirst + 1;
    const xL = run.first - 1;
    const xR = run.last + 1;
    const hasL = xL >= 0 && edgeProfile(sigma, conf, pairLive, xL - 1, -1, nPairs, ns, xL, sL, cL);
    const hasR = xR < nTraces && edgeProfile(sigma, conf, pairLive, xR, +1, nPairs, ns, xR, sR, cR);
    const splat = new ColumnSplat(nCols, ns);
    const distFactor = (x: number): number => {
      let d = Infinity;
      if (xL >= 0) d = Math.min(d, x - xL);
      if (xR < nTraces) d = Math.min(d, xR - x);
      return 1 / (1 + (d / DISTANCE_SCALE_TRACES) ** 2);
    };
    if (hasL && hasR) {
      const D = xR - xL;
      const trace = (tL: number, tR: number, slL: number, slR: number, c: number): void => {
        const dev = (D * Math.abs(slL - slR)) / 8;
        const cc = c / (1 + (dev / CURVATURE_SCALE_SAMPLES) ** 2);
        for (let col = 0; col < nCols; col++) {
          const x = qFirst + col + 0.5;
          const xi = (x - xL) / D;
          const xi2 = xi * xi, xi3 = xi2 * xi;
          const t = (2 * xi3 - 3 * xi2 + 1) * tL + (xi3 - 2 * xi2 + xi) * D * slL + (-2 * xi3 + 3 * xi2) * tR + (xi3 - xi2) * D * slR;
          const dt = (6 * xi2 - 6 * xi) * tL + (3 * xi2 - 4 * xi + 1) * D * slL + (-6 * xi2 + 6 * xi) * tR + (3 * xi2 - 2 * xi) * D * slR;
          splat.add(col, t, dt / D, cc * distFactor(x));
        }
      };
      for (let tL = 0; tL <= ns - 1; tL += SEED_STEP_SAMPLES) {
        const slL = interpColumn(sL, tL);
        let tau = D * slL;
        for (let k = 0; k < 10; k++) tau = (D * (slL + interpColumn(sR, tL + tau))) / 2;
        const tR = tL + tau;
        trace(tL, tR, slL, interpColumn(sR, tR), Math.min(interpColumn(cL, tL), interpColumn(cR, tR)));
      }
      for (let tR = 0; tR <= ns - 1; tR += SEED_STEP_SAMPLES) {
        const slR = interpColumn(sR, tR);
        let tau = D * slR;
        for (let k = 0; k < 10; k++) tau = (D * (interpColumn(sL, tR - tau) + slR)) / 2;
        const tL = tR - tau;
        trace(tL, tR, interpColumn(sL, tL), slR, Math.min(interpColumn(cL, tL), interpColumn(cR, tR)));
      }
    } else if (hasL || hasR) {
      const sE = hasL ? sL : sR, cE = hasL ? cL : cR;
      const xE = hasL ? xL : xR;
      for (let tE = 0; tE <= ns - 1; tE += SEED_STEP_SAMPLES) {
        const s = interpColumn(sE, tE);
        const c = interpColumn(cE, tE);
        for (let col = 0; col < nCols; col++) {
          const x = qFirst + col + 0.5;
          splat.add(col, tE + s * (x - xE), s, c * distFactor(x));
        }
      }
    }
    for (let col = 0; col < nCols; col++) {
      const q = qFirst + col;
      if (hasL || hasR) splat.resolve(col, sigma, conf, q);
      else conf.fill(0, q * ns, (q + 1) * ns);
      mask.fill(1, q * ns, (q + 1) * ns);
    }
  }
  return mask;
}
