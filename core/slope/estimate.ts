/**
 * The public entry for local slopes: estimateSlopes(data, nTraces, nSamples, liveTraces, options, cancel).
 * Steps (docs/slopes.md explains the choices):
 *  1. live mask: the caller's mask minus traces that are all zero;
 *  2. regular decimation by k (given or read from the mask): work on the coarse grid of live traces;
 *  3. band limit: low-pass above 1.25 × the frequency holding 99 % of the energy (fft.js), then amplitude
 *     balance (balance.ts);
 *  4. steepest slope measured on an 8× time-decimated copy (structure tensor) → number of coarse-to-fine levels,
 *     a bound on |σ|, and, for decimated data, a low-pass below the alias frequency 1/(2|σ_c,max|);
 *  5. 'pwd': coarse-to-fine over time-decimated copies (σ halves per level); the coarsest level starts from and
 *     is regularised toward a structure-tensor prior; each finer level starts from and is regularised toward the
 *     level above, with a frozen integer shift where |σ| is steep (destruction.ts); Gauss-Newton per level
 *     (gauss-newton.ts). 'tensor': structure tensor on the time level that keeps slopes gentle;
 *  6. confidence (normalised destruction residual, or coherence for 'tensor');
 *  7. slopes in runs of missing traces carried along events from the gap's edges (gap.ts);
 *  8. σ_f = σ_c/k mapped to the fine pair grid (decimation.ts); 9. hand edits applied last (edits.ts).
 * Layout: data trace-major (core/grid/gather.ts); outputs as in SlopeField (types.ts).
 */
import { InputFileError, throwIfCancelled, type CancelToken } from '../problems';
import type { PwdOrder } from '../pwd/maxflat';
import { createLowpassWorkspace, lowpassTracesUnchecked } from '../fft/lowpass';
import { createRealFftPlan, nextPowerOfTwo } from '../fft/real-fft';
import { balanceAmplitudes } from './balance';
import { halveTime } from './halve';
import { coarseGridOf, coarsePairsToFinePairs, detectDecimationFactor, extractCoarse, finePairOfCoarsePair, type CoarseGrid } from './decimation';
import { applyDipEdits, validateDipEdits, type DipEdit } from './edits';
import { inpaintGapSlopes } from './gap';
import { createGaussNewtonWorkspace, destructionConfidence, gaussNewtonSlopes, type GaussNewtonSettings, type GaussNewtonWorkspace, type SlopeObservations } from './gauss-newton';
import { pairsToTracesUnchecked } from './pair-grid';
import { settleIncoherentSlopes } from './settle';
import { createTensorWorkspace, structureTensorSlopesUnchecked } from './tensor';
import { createTriangle2D, triangle2DApply, triangleTimeUnchecked } from './triangle';
import type { SlopeField, SlopeInfo, SlopeOptions } from './types';

export const SLOPE_DEFAULTS = {
  method: 'pwd',
  radiusTimeSamples: 6,
  radiusTraces: 3,
  order: 1,
  outerIterations: 4,
  innerIterations: 4,
  stepLimit: 1,
} as const;

/**
 * Largest |σ| a level is asked to resolve without a coarser level above it (per filter order). Time decimation
 * alone does not cure spatial aliasing (f·σ is invariant); the low-pass that comes with it does: at level M the
 * data hold f < 0.5/M, so slopes up to about M are unaliased there.
 */
const GENTLE_SLOPE: Record<PwdOrder, number> = { 1: 1, 2: 1.5 };
/** The tensor on the decimated copy reads steep slopes a little low: plan levels with this margin. */
const MEASURE_MARGIN = 1.2;
const MAX_TIME_LEVELS = 4;
const MIN_LEVEL_SAMPLES = 24;
const TENSOR_CLAMP = 64;
/** Slopes steeper than this (samples per trace) are not taken as events when planning levels: incoherent traces
 * look like vertical events to a structure tensor. */
const MAX_MEASURABLE_SLOPE = 32;
const BAND_MARGIN = 1.25;
/**
 * Gauss-Newton stops, after at least two steps, once a step moves the fitted slopes by less than this rms (samples
 * per trace). Measured: first steps 0.004–0.02 on analytic gathers, second 0.001–0.005 (stopping after one step
 * cost 1 dB on an analytic 16-trace gap fill, so two is the minimum); on the demo line 0.24–0.54, 0.11–0.24, and
 * the third still 0.06–0.11, so hard data get up to outerIterations (demo fills gained up to 2 dB).
 */
const CONVERGED_STEP = 0.02;
/** Share of the gradient energy at coherence > 0.7 below which a gather is taken as holding no events. */
const MEASURE_MIN_COHERENT_SHARE = 0.05;
/** Every estimated |σ| is kept below max(MIN_SLOPE_BOUND, SLOPE_BOUND_FACTOR × steepest measured slope). */
const MIN_SLOPE_BOUND = 3;
const SLOPE_BOUND_FACTOR = 2;

/**
 * Frequency (cycles per sample) below which `fraction` of the energy of the traces lies (power spectra of tapered
 * traces summed; fft.js through core/fft).
 */
export function energyBandEdge(u: ArrayLike<number>, nTraces: number, nSamples: number, fraction: number): number {
  const size = nextPowerOfTwo(nSamples);
  const plan = createRealFftPlan(size);
  const buf = new Float64Array(size), spec = new Float64Array(2 * size);
  const power = new Float64Array(size / 2 + 1);
  // Tukey taper (10 % cosine at each end): a trace cut off mid-event would otherwise leak broadband energy.
  const taper = new Float64Array(nSamples).fill(1);
  const edge = Math.max(1, Math.floor(0.1 * nSamples));
  for (let t = 0; t < edge; t++) taper[t] = taper[nSamples - 1 - t] = 0.5 * (1 - Math.cos((Math.PI * (t + 0.5)) / edge));
  // A subset of traces is enough for a band edge (at most ~48 spectra).
  const step = Math.max(1, Math.floor(nTraces / 48));
  for (let x = 0; x < nTraces; x += step) {
    for (let t = 0; t < nSamples; t++) buf[t] = u[x * nSamples + t] * taper[t];
    plan.impl.realTransform(spec, buf);
    for (let k = 0; k <= size / 2; k++) power[k] += spec[2 * k] * spec[2 * k] + spec[2 * k + 1] * spec[2 * k + 1];
  }
  let total = 0;
  for (let k = 1; k <= size / 2; k++) total += power[k];
  if (!(total > 0)) return 0.5;
  let acc = 0;
  for (let k = 1; k <= size / 2; k++) {
    acc += power[k];
    if (acc >= fraction * total) return k / size;
  }
  return 0.5;
}

function badOption(field: string, found: unknown, expected: string): InputFileError {
  return new InputFileError({ code: 'input.bad-argument', severity: 'error', field, message: `slope option ${field} is out of range.`, found: String(found), expected });
}

interface Resolved extends GaussNewtonSettings {
  method: 'pwd' | 'tensor';
}

function resolveOptions(o: SlopeOptions): Resolved {
  const r: Resolved = {
    method: o.method ?? SLOPE_DEFAULTS.method,
    radiusTimeSamples: o.radiusTimeSamples ?? SLOPE_DEFAULTS.radiusTimeSamples,
    radiusTraces: o.radiusTraces ?? SLOPE_DEFAULTS.radiusTraces,
    order: o.order ?? SLOPE_DEFAULTS.order,
    outerIterations: o.outerIterations ?? SLOPE_DEFAULTS.outerIterations,
    innerIterations: o.innerIterations ?? SLOPE_DEFAULTS.innerIterations,
    stepLimit: o.stepLimit ?? SLOPE_DEFAULTS.stepLimit,
    convergedStep: CONVERGED_STEP,
  };
  if (r.method !== 'pwd' && r.method !== 'tensor') throw badOption('method', r.method, 'pwd or tensor');
  for (const [k, v, lo, hi] of [['radiusTimeSamples', r.radiusTimeSamples, 1, 500], ['radiusTraces', r.radiusTraces, 1, 200], ['outerIterations', r.outerIterations, 1, 50], ['innerIterations', r.innerIterations, 1, 500]] as const)
    if (!Number.isInteger(v) || v < lo || v > hi) throw badOption(k, v, `a whole number in [${lo}, ${hi}]`);
  if (r.order !== 1 && r.order !== 2) throw badOption('order', r.order, '1 or 2');
  if (!(r.stepLimit > 0)) throw badOption('stepLimit', r.stepLimit, '> 0');
  return r;
}

/** Time-halved copies of one work gather, shared by the slope measure and the pyramid (levels[l]: 2^l × fewer). */
interface Halvings {
  readonly source: Float64Array;
  readonly levels: { data: Float64Array; nSamples: number }[];
}

/** Low-pass and take every m-th sample (m a power of two) by cascaded half-band decimation (halve.ts). */
function decimateTime(h: Halvings, nTraces: number, m: number): { data: Float64Array; nSamples: number } {
  const want = Math.round(Math.log2(m));
  while (h.levels.length <= want) {
    const prev = h.levels[h.levels.length - 1];
    h.levels.push(halveTime(prev.data, nTraces, prev.nSamples));
  }
  return h.levels[want];
}

function halvingsOf(u: Float64Array, nSamples: number): Halvings {
  return { source: u, levels: [{ data: u, nSamples }] };
}

/** Upsample a pair field in time by factor m (values × m: slopes scale with the time step). */
function upsampleSlopes(coarse: Float64Array, nPairs: number, nsCoarse: number, nsFine: number, m: number, valueScale: number): Float64Array {
  const out = new Float64Array(nPairs * nsFine);
  for (let p = 0; p < nPairs; p++) {
    for (let t = 0; t < nsFine; t++) {
      let tc = t / m;
      if (tc > nsCoarse - 1) tc = nsCoarse - 1;
      const j = Math.min(nsCoarse - 2, Math.floor(tc));
      const f = nsCoarse < 2 ? 0 : tc - j;
      const a = coarse[p * nsCoarse + Math.max(0, j)], b = nsCoarse < 2 ? a : coarse[p * nsCoarse + j + 1];
      out[p * nsFine + t] = valueScale * ((1 - f) * a + f * b);
    }
  }
  return out;
}

function pairLiveOf(traceLive: Uint8Array): Uint8Array {
  const out = new Uint8Array(Math.max(0, traceLive.length - 1));
  for (let p = 0; p < out.length; p++) out[p] = traceLive[p] && traceLive[p + 1] ? 1 : 0;
  return out;
}

/** Steepest slope (90th percentile of |σ| where the tensor is coherent), measured on a time-decimated copy. */
export function measureSteepestSlope(u: Float64Array, nTraces: number, nSamples: number, pairLive: Uint8Array, radiusTimeSamples: number, radiusTraces: number, halvings?: Halvings): number {
  let m = 8;
  while (m > 1 && nSamples / m < MIN_LEVEL_SAMPLES) m /= 2;
  const h = halvings && halvings.source === u ? halvings : halvingsOf(u, nSamples);
  const lev = decimateTime(h, nTraces, m);
  const ws = createTensorWorkspace(nTraces, lev.nSamples, Math.max(4, Math.round(radiusTimeSamples / m)), Math.max(4, radiusTraces));
  const n = (nTraces - 1) * lev.nSamples;
  const s = new Float64Array(n), c = new Float64Array(n), e = new Float64Array(n);
  structureTensorSlopesUnchecked(ws, s, c, lev.data, pairLive, TENSOR_CLAMP, e);
  let meanE = 0;
  for (let i = 0; i < n; i++) meanE += e[i];
  meanE /= Math.max(1, n);
  // Gate: in noise the tensor finds "coherent" orientations only by chance, in small specks (measured: 1.5 % of
  // the energy of pure Gaussian noise at coherence > 0.7, against 19–25 % on the demo line, 50 % on WL1 and
  // 98 % on analytic events). Without it pure noise measured 18 samples per trace and planned 4 levels.
  let sw = 0, swc = 0;
  for (let i = 0; i < n; i++) { sw += e[i]; if (c[i] > 0.7) swc += e[i]; }
  if (!(sw > 0) || swc < MEASURE_MIN_COHERENT_SHARE * sw) return 0;
  const vals: number[] = [];
  for (let i = 0; i < n; i++) if (c[i] > 0.7 && e[i] > 0.1 * meanE && Math.abs(s[i]) * m < MAX_MEASURABLE_SLOPE) vals.push(Math.abs(s[i]));
  if (vals.length === 0) return 0;
  vals.sort((a, b) => a - b);
  return vals[Math.min(vals.length - 1, Math.floor(0.9 * vals.length))] * m;
}

/**
 * Number of coarse-to-fine levels: the coarsest level must see the steepest slope unaliased. At level L the data
 * hold frequencies below min(band, 0.5/2^L) cycles per (fine) sample; a slope σ aliases above 1/(2|σ|), so we need
 * min(band, 0.5/2^L) · margin · σ_max ≤ ½. On band-limited data gentle and moderate slopes need no level at all;
 * GENTLE_SLOPE only matters for full-band data.
 */
function levelsFor(maxSlope: number, order: PwdOrder, nSamples: number, bandCyclesPerSample: number): number {
  let levels = 0;
  const steep = MEASURE_MARGIN * maxSlope;
  const aliased = (l: number) => Math.min(bandCyclesPerSample, 0.5 / 2 ** l) * steep > 0.5 && steep / 2 ** l > GENTLE_SLOPE[order];
  while (levels < MAX_TIME_LEVELS && aliased(levels) && nSamples / 2 ** (levels + 1) >= MIN_LEVEL_SAMPLES) levels++;
  return levels;
}

interface WorkResult {
  sigma: Float64Array;
  conf: Float64Array;
  residualStart: number;
  residualEnd: number;
}

function estimateOnWorkGrid(
  u: Float64Array, nTraces: number, nSamples: number, traceLive: Uint8Array, s: Resolved, levels: number, slopeBound: number,
  observations: SlopeObservations | undefined, cancel: CancelToken | undefined, halvings?: Halvings, silent?: Uint8Array, settleAll = true,
): WorkResult {
  const pairLive = pairLiveOf(traceLive);
  const nPairs = nTraces - 1;
  const h = halvings && halvings.source === u ? halvings : halvingsOf(u, nSamples);
  const pyramid = Array.from({ length: levels + 1 }, (_, l) => decimateTime(h, nTraces, 2 ** l));
  const top = pyramid[levels];
  const mTop = 2 ** levels;
  const rtTop = Math.max(2, Math.round(s.radiusTimeSamples / mTop));
  const tws = createTensorWorkspace(nTraces, top.nSamples, rtTop, s.radiusTraces);
  let prior: Float64Array = new Float64Array(nPairs * top.nSamples);
  let coh: Float64Array = new Float64Array(nPairs * top.nSamples);
  structureTensorSlopesUnchecked(tws, prior, coh, top.data, pairLive, slopeBound / mTop);
  throwIfCancelled(cancel);
  if (s.method === 'tensor') {
    const sigma = levels > 0 ? upsampleSlopes(prior, nPairs, top.nSamples, nSamples, mTop, mTop) : prior;
    if (levels > 0) coh = upsampleSlopes(coh, nPairs, top.nSamples, nSamples, mTop, 1);
    return { sigma, conf: coh, residualStart: NaN, residualEnd: NaN };
  }
  let residualStart = NaN, residualEnd = NaN;
  let shift: Int32Array | null = null;
  let sigma = prior;
  // One workspace at the finest size; coarser levels use views into it.
  const finest = levels > 0 ? createGaussNewtonWorkspace(nTraces, nSamples, Math.max(2, s.radiusTimeSamples), s.radiusTraces) : undefined;
  let ws: GaussNewtonWorkspace | undefined;
  for (let l = levels; l >= 0; l--) {
    const lev = pyramid[l];
    const m = 2 ** l;
    const rt = Math.max(2, Math.round(s.radiusTimeSamples / m));
    if (l < levels) {
      prior = upsampleSlopes(sigma, nPairs, pyramid[l + 1].nSamples, lev.nSamples, 2, 2);
      // The deviation from the prior is what shaping smooths: a rough prior would leak its roughness into the
      // answer (δ* − T²δ*), so the prior is smoothed with the same smoother first.
      const tri = createTriangle2D(nPairs, lev.nSamples, rt, s.radiusTraces);
      // Normalised by the smoothed live-pair mask: no shrinking at the edges, no leak from missing traces.
      const wts = new Float64Array(prior.length);
      for (let p = 0; p < nPairs; p++) if (pairLive[p]) wts.fill(1, p * lev.nSamples, (p + 1) * lev.nSamples);
      const wp = new Float64Array(prior.length);
      for (let i = 0; i < prior.length; i++) wp[i] = wts[i] * prior[i];
      triangle2DApply(tri, wts, triangle2DApply(tri, wts, wts));
      triangle2DApply(tri, wp, triangle2DApply(tri, wp, wp));
      for (let i = 0; i < prior.length; i++) if (wts[i] > 1e-3) prior[i] = wp[i] / wts[i];
    }
    sigma = prior.slice();
    // Freeze the integer part where the start is steep (destruction.ts), so the filter works on |f| ≲ ½.
    shift = null;
    for (let i = 0; i < prior.length; i++) {
      if (Math.abs(prior[i]) > GENTLE_SLOPE[s.order]) {
        shift ??= new Int32Array(prior.length);
        shift[i] = Math.round(prior[i]);
      }
    }
    ws = createGaussNewtonWorkspace(nTraces, lev.nSamples, rt, s.radiusTraces, finest);
    const outer = s.outerIterations;
    const rep = gaussNewtonSlopes(ws, sigma, lev.data, pairLive, prior, shift, { ...s, radiusTimeSamples: rt, outerIterations: outer }, l === 0 ? observations : undefined, cancel);
    // Incoherent zones may wander: keep every slope within the planned bound.
    const b = slopeBound / m;
    for (let i = 0; i < sigma.length; i++) sigma[i] = sigma[i] > b ? b : sigma[i] < -b ? -b : sigma[i];
    if (l === 0) {
      residualStart = rep.residualStart;
      residualEnd = rep.residualEnd;
    }
  }
  const conf = destructionConfidence(new Float64Array(sigma.length), u, sigma, shift, pairLive, nTraces, nSamples, s.order, s.radiusTimeSamples, s.radiusTraces, ws);
  // Silent stretches (before band limit and balance) say nothing, however coherent the filters' ringing there.
  if (silent) for (let i = 0; i < conf.length; i++) if (silent[i]) conf[i] = 0;
  // Quiet and incoherent zones: the fit there is arbitrary; settle to the trusted slopes around (settle.ts).
  // On a decimated (coarse) grid the residual also measures aliasing, so low confidence there does not mean "no
  // information" (measured: settling everywhere cost the decimated demo line 0.8–2.5 dB); settle silence only.
  settleIncoherentSlopes(sigma, conf, nPairs, nSamples, s.radiusTimeSamples, s.radiusTraces, settleAll ? undefined : silent);
  return { sigma, conf, residualStart, residualEnd };
}

/** Silence below this fraction of the gather's mean energy: the balance's floor (balance.ts) is 120 dB down. */
const SILENT_FRACTION = 1e-10;

/**
 * Pair samples whose two traces are silent around them (true amplitudes, before band limit and balance, which
 * spread ringing into silence and lift it to full level): time-smoothed energy below SILENT_FRACTION × the mean.
 */
function silentPairsOf(u: ArrayLike<number>, nTraces: number, nSamples: number, radiusTimeSamples: number): Uint8Array {
  const nPairs = nTraces - 1;
  const e = new Float64Array(nTraces * nSamples);
  let mean = 0;
  for (let i = 0; i < e.length; i++) { e[i] = u[i] * u[i]; mean += e[i]; }
  mean /= Math.max(1, e.length);
  triangleTimeUnchecked(e, e, nTraces, nSamples, radiusTimeSamples, new Float64Array(nSamples + radiusTimeSamples));
  const out = new Uint8Array(nPairs * nSamples);
  const floor = SILENT_FRACTION * mean;
  for (let i = 0; i < out.length; i++) if (e[i] + e[i + nSamples] <= floor) out[i] = 1;
  return out;
}

function liveMaskOf(data: ArrayLike<number>, nTraces: number, nSamples: number, liveTraces: Uint8Array): Uint8Array {
  const live = new Uint8Array(nTraces);
  for (let x = 0; x < nTraces; x++) {
    if (!liveTraces[x]) continue;
    let any = false;
    for (let t = 0; t < nSamples && !any; t++) if (data[x * nSamples + t] !== 0) any = true;
    live[x] = any ? 1 : 0;
  }
  return live;
}

/** Samples the fine-grid edit raster onto the work grid as observations (× k for coarse slopes). */
function observationsOnWorkGrid(value: Float64Array, weight: Float64Array, grid: CoarseGrid | null, nFineTraces: number, nWorkTraces: number, nSamples: number): SlopeObservations {
  if (!grid) return { value, weight };
  const n = (nWorkTraces - 1) * nSamples;
  const v = new Float64Array(n), w = new Float64Array(n);
  for (let j = 0; j < nWorkTraces - 1; j++) {
    const p = finePairOfCoarsePair(grid, j, nFineTraces - 1);
    for (let t = 0; t < nSamples; t++) {
      v[j * nSamples + t] = grid.factor * value[p * nSamples + t];
      w[j * nSamples + t] = weight[p * nSamples + t];
    }
  }
  return { value: v, weight: w };
}

/**
 * Estimates local slopes of a regular-grid gather (samples per trace) with a confidence map.
 * @param data        trace-major samples, nTraces*nSamples (true amplitudes; balanced internally)
 * @param liveTraces  1 live, 0 missing or dead, per grid trace
 * @throws InputFileError input.bad-argument for bad options or shapes, slope.no-live-pairs when no two
 *         neighbouring (coarse-grid) traces are live; CancelledError when cancel.cancelled turns true.
 */
export function estimateSlopes(
  data: Float64Array | Float32Array, nTraces: number, nSamples: number, liveTraces: Uint8Array,
  options: SlopeOptions = {}, cancel?: CancelToken,
): SlopeField {
  const s = resolveOptions(options);
  if (!Number.isInteger(nTraces) || !Number.isInteger(nSamples) || nTraces < 2 || nSamples < 1)
    throw badOption('nTraces/nSamples', `${nTraces}×${nSamples}`, 'at least 2 traces and 1 sample');
  if (data.length !== nTraces * nSamples) throw badOption('data length', data.length, `nTraces*nSamples = ${nTraces * nSamples}`);
  if (liveTraces.length !== nTraces) throw badOption('liveTraces length', liveTraces.length, `nTraces = ${nTraces}`);
  for (let i = 0; i < data.length; i++)
    if (!Number.isFinite(data[i])) throw new InputFileError({ code: 'input.bad-argument', severity: 'error', traceIndex: Math.floor(i / nSamples), message: 'a sample is not a finite number.', found: String(data[i]), hint: 'Mark the trace as dead or repair the file.' });
  const edits: readonly DipEdit[] = options.edits ? validateDipEdits(options.edits) : [];

  const traceLive = liveMaskOf(data, nTraces, nSamples, liveTraces);
  const kOpt = options.decimationFactor ?? 'auto';
  if (kOpt !== 'auto' && (!Number.isInteger(kOpt) || kOpt < 1 || kOpt > nTraces)) throw badOption('decimationFactor', kOpt, 'a whole number ≥ 1 or auto');
  const k = kOpt === 'auto' ? detectDecimationFactor(traceLive) : kOpt;
  const grid = k > 1 ? coarseGridOf(traceLive, k) : null;
  let work: Float64Array<ArrayBufferLike>;
  let workLive: Uint8Array;
  if (grid) {
    const c = extractCoarse(data, nSamples, grid, traceLive);
    work = c.data;
    workLive = c.live;
  } else {
    work = data instanceof Float64Array ? data : Float64Array.from(data);
    workLive = traceLive;
  }
  const nWork = workLive.length;
  const pairLive = pairLiveOf(workLive);
  if (nWork < 2 || !pairLive.some((v) => v === 1))
    throw new InputFileError({
      code: 'slope.no-live-pairs', severity: 'error', message: 'no two neighbouring live traces to estimate slopes from.',
      found: `${traceLive.reduce((a, b) => a + b, 0)} live of ${nTraces} traces, decimation factor ${k}`,
      hint: k === 1 ? 'If live traces are every k-th position, give the decimation factor.' : 'Check the live-trace mask.',
    });
  throwIfCancelled(cancel);
  const silent = silentPairsOf(work, nWork, nSamples, s.radiusTimeSamples);
  const lpOpt = options.lowpassCyclesPerSample ?? 'auto';
  if (typeof lpOpt === 'number' && !(lpOpt > 0 && lpOpt <= 0.5)) throw badOption('lowpassCyclesPerSample', lpOpt, 'in (0, 0.5], auto or off');
  // Band limit: incoherent noise above the signal band carries little energy but, weighted by the time
  // derivative in g, would steer the estimate; cut above BAND_MARGIN × the frequency holding 99 % of the energy.
  let cutoff = typeof lpOpt === 'number' ? lpOpt : lpOpt === 'auto' ? Math.min(0.5, BAND_MARGIN * energyBandEdge(work, nWork, nSamples, 0.99)) : 0.5;
  const lowpass = (c: number) => {
    const ws = createLowpassWorkspace(nSamples, 0.8 * c, c);
    work = lowpassTracesUnchecked(work === data ? new Float64Array(work.length) : work, work, nWork, nSamples, ws);
  };
  if (cutoff < 0.45) lowpass(cutoff);
  else cutoff = 0.5;
  if (options.balance ?? true) work = balanceAmplitudes(work, nWork, nSamples, Math.max(16, 3 * s.radiusTimeSamples), 1);

  const maxOpt = options.maxSlopeSamplesPerTrace ?? 'auto';
  if (maxOpt !== 'auto' && !(maxOpt >= 0)) throw badOption('maxSlopeSamplesPerTrace', maxOpt, '≥ 0 or auto');
  let halvings = halvingsOf(work, nSamples);
  const maxSlope = maxOpt === 'auto' ? measureSteepestSlope(work, nWork, nSamples, pairLive, s.radiusTimeSamples, s.radiusTraces, halvings) : maxOpt;
  // Decimated data: also below the alias frequency 1/(2|σ_c,max|) of the steepest coarse-grid slope (methods.md §2.6).
  if (lpOpt === 'auto' && grid && maxSlope > 0) {
    const alias = 0.9 / (2 * maxSlope);
    if (alias < cutoff) {
      cutoff = alias;
      lowpass(cutoff);
      halvings = halvingsOf(work, nSamples); // the low-pass may have worked in place
    }
  }
  throwIfCancelled(cancel);

  const levels = levelsFor(maxSlope, s.order, nSamples, cutoff);
  const slopeBound = Math.max(MIN_SLOPE_BOUND, SLOPE_BOUND_FACTOR * maxSlope);
  const nFinePairs = (nTraces - 1) * nSamples;
  let observations: SlopeObservations | undefined;
  let editRasterValue: Float64Array | null = null;
  let editRasterWeight: Float64Array | null = null;
  if (edits.length && options.propagateEdits) {
    // Rasterise the edits over a zero field to find where they act; 'add' edits become targets after a first pass.
    editRasterValue = new Float64Array(nFinePairs);
    editRasterWeight = new Float64Array(nFinePairs);
  }
  let res = estimateOnWorkGrid(work, nWork, nSamples, workLive, s, levels, slopeBound, undefined, cancel, halvings, silent, !grid);
  if (editRasterValue && editRasterWeight) {
    const fine = grid ? coarsePairsToFinePairs(new Float64Array(nFinePairs), res.sigma, grid, nTraces, nSamples, 1 / k) : res.sigma.slice();
    applyDipEdits(fine, editRasterWeight, nTraces, nSamples, edits);
    editRasterValue.set(fine);
    observations = observationsOnWorkGrid(editRasterValue, editRasterWeight, grid, nTraces, nWork, nSamples);
    res = estimateOnWorkGrid(work, nWork, nSamples, workLive, s, levels, slopeBound, observations, cancel, halvings, silent, !grid);
  }
  const gapOpt = options.gapSlopes ?? 'along-events';
  if (gapOpt !== 'along-events' && gapOpt !== 'prior') throw badOption('gapSlopes', gapOpt, 'along-events or prior');
  const inpaintedWork = gapOpt === 'along-events' ? inpaintGapSlopes(res.sigma, res.conf, workLive, nWork, nSamples) : new Uint8Array(res.sigma.length);

  let estimatePairs: Float64Array, confidencePairs: Float64Array, inpaintedPairs: Uint8Array;
  if (grid) {
    estimatePairs = coarsePairsToFinePairs(new Float64Array(nFinePairs), res.sigma, grid, nTraces, nSamples, 1 / k);
    confidencePairs = coarsePairsToFinePairs(new Float64Array(nFinePairs), res.conf, grid, nTraces, nSamples, 1);
    const inp = Float64Array.from(inpaintedWork);
    const inpFine = coarsePairsToFinePairs(new Float64Array(nFinePairs), inp, grid, nTraces, nSamples, 1);
    inpaintedPairs = Uint8Array.from(inpFine, (v) => (v > 0 ? 1 : 0));
  } else {
    estimatePairs = res.sigma;
    confidencePairs = res.conf;
    inpaintedPairs = inpaintedWork;
  }
  const slopePairs = estimatePairs.slice();
  const editWeightPairs = new Float64Array(nFinePairs);
  if (edits.length) applyDipEdits(slopePairs, editWeightPairs, nTraces, nSamples, edits);
  const slopeTraces = pairsToTracesUnchecked(new Float64Array(nTraces * nSamples), slopePairs, nTraces, nSamples);
  const confidence = pairsToTracesUnchecked(new Float64Array(nTraces * nSamples), confidencePairs, nTraces, nSamples);
  const info: SlopeInfo = {
    method: s.method, decimationFactor: k, timeLevels: s.method === 'pwd' || levels > 0 ? levels : 0,
    maxSlopeSamplesPerTrace: maxSlope, lowpassCyclesPerSample: cutoff,
    residualStart: res.residualStart, residualEnd: res.residualEnd,
    radiusTimeSamples: s.radiusTimeSamples, radiusTraces: s.radiusTraces, order: s.order,
  };
  return { nTraces, nSamples, slopeTraces, slopePairs, estimatePairs, confidence, confidencePairs, inpaintedPairs, editWeightPairs, liveTraces: traceLive, info };
}

/**
 * Re-applies an edit list to an existing estimate without re-estimating (undo/redo, restore to estimate).
 * Returns a new field sharing the estimate, confidence and masks.
 */
export function withDipEdits(field: SlopeField, edits: readonly DipEdit[]): SlopeField {
  const { nTraces, nSamples } = field;
  const slopePairs = field.estimatePairs.slice();
  const editWeightPairs = new Float64Array(slopePairs.length);
  applyDipEdits(slopePairs, editWeightPairs, nTraces, nSamples, edits);
  const slopeTraces = pairsToTracesUnchecked(new Float64Array(nTraces * nSamples), slopePairs, nTraces, nSamples);
  return { ...field, slopePairs, slopeTraces, editWeightPairs };
}
