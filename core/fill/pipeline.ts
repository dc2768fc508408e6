/**
 * One gather, start to finish: slopes, fill, hold-out check, amplitude check, optional second pass.
 * The CLI's worker threads and the UI's Web Worker both call fillGather, so a gather gets the same answer
 * wherever it is filled.
 *
 * Layout: trace-major (core/grid/gather.ts); slopes on the pair grid (core/pwd/operator.ts).
 * Filled traces are estimates, not recordings: the hold-out score is the measure of trust.
 */
import { BugError, isInputFileError, throwIfCancelled, type CancelToken } from '../problems';
import { snrDb } from '../quality/snr';
import { fillRmsRatio, gapRmsRatio, liftQuietFills } from './amplitude';
import { holdoutSlopesNearBlock, slopeEstimator, slopesForFill, type SlopeEstimator } from './fill-slopes';
import type { SlopeOptions } from '../slope/index';
import { solveGapsNet, type NetSolverOptions } from '../nn/solver';
import { designHoldout, type HoldoutKind } from './holdout';
import { IterationTracker, LSQ_DEFAULTS, solveLeastSquares, type LsqSettings } from './lsq';
import type { PwdOrder } from '../pwd/maxflat';
import { countToFill, unknownMask, type FillPlan } from './plan';
import type { GapSolverFn, GapSolverInput, GapSolverResult, SolverName, SolverProgress } from './solver';

export interface FillSettings {
  solver: SolverName;
  lsq: LsqSettings;
  /** Settings handed to the network solver (core/nn), plain data. */
  net: Record<string, unknown>;
  /** Run the hold-out check (on by default; only tests of the solver itself switch it off). */
  holdout: boolean;
  /** Re-estimate slopes on the filled gather and fill again; kept only when the hold-out score improves. */
  secondPass: boolean;
  /** Slope estimation options (core/slope), dip edits included; plain data as saved in recipes. */
  slope: SlopeOptions;
  /** Destructor orders the hold-out chooses from for the least-squares fill (one entry: no choice). */
  orders: PwdOrder[];
  /** Lift filled windows quieter than 80 % of their recorded neighbours' level (core/fill/amplitude.ts). */
  keepAmplitude: boolean;
}

export const FILL_DEFAULTS: Readonly<FillSettings> = {
  solver: 'lsq',
  lsq: { ...LSQ_DEFAULTS },
  net: {},
  holdout: true,
  secondPass: false,
  slope: {},
  orders: [1, 2],
  keepAmplitude: true,
};

export type FillStage = 'slopes' | 'fill' | 'holdout' | 'second-pass';

export interface FillProgress {
  stage: FillStage;
  /** Overall fraction done, 0..1. */
  fraction: number;
  /** The solver's own progress within the stage, when it reports one (loss curves). */
  solver?: SolverProgress;
}

export interface FillHooks {
  cancel?: CancelToken;
  onProgress?: (p: FillProgress) => void;
  /** Replaces the core/slope estimator built from settings.slope (tests, custom estimators). */
  estimator?: SlopeEstimator;
  /** Replaces built-in solvers by name (e.g. the network on a worker pool). */
  solvers?: Partial<Record<SolverName, GapSolverFn>>;
}

export interface FillGatherInput {
  /** Regular-grid gather; positions the plan fills may hold anything. */
  data: Float32Array | Float64Array;
  nTraces: number;
  nSamples: number;
  plan: FillPlan;
  /** Slopes to use as given (a dip file or an edited field): no estimation, and the hold-out uses them too. */
  slopePairs?: Float64Array;
}

export interface FillGatherResult {
  /** Whole gather; recorded traces bit-for-bit as given, filled traces at the plan's positions. */
  filled: Float32Array;
  slopePairs: Float64Array;
  unknownTraces: Uint8Array;
  missingCount: number;
  solver: SolverName;
  iterations: number;
  converged: boolean;
  seconds: number;
  /** SNR (dB) of the hold-out fill on the hidden recorded traces only; NaN when no hold-out was possible. */
  holdoutSnrDb: number;
  holdoutKind: HoldoutKind;
  holdoutTraces: number[];
  /** RMS of the widest filled block over the RMS of recorded traces beside it (≈1 when amplitudes hold). */
  gapRmsRatio: number;
  /** RMS of all filled traces over the RMS of all recorded traces. */
  fillRmsRatio: number;
  secondPass: 'off' | 'kept' | 'rejected';
  details: Record<string, number | string>;
}

function fullSettings(s: Partial<FillSettings>): FillSettings {
  return { ...FILL_DEFAULTS, ...s, lsq: { ...LSQ_DEFAULTS, ...(s.lsq ?? {}) }, net: { ...(s.net ?? {}) }, slope: { ...(s.slope ?? {}) }, orders: [...(s.orders ?? FILL_DEFAULTS.orders)] };
}

/** Built-in solvers: least squares (core/fill/lsq.ts) and the coordinate network (core/nn/solver.ts, in this thread). */
const BUILTIN_SOLVERS: Record<SolverName, GapSolverFn> = {
  lsq: (input, settings) => solveLeastSquares(input, settings as Partial<LsqSettings>),
  net: (input, settings) => solveGapsNet(input, settings as NetSolverOptions),
};

export async function fillGather(input: FillGatherInput, settingsIn: Partial<FillSettings> = {}, hooks: FillHooks = {}): Promise<FillGatherResult> {
  const start = Date.now();
  const settings = fullSettings(settingsIn);
  const { nTraces, nSamples, plan } = input;
  if (input.data.length !== nTraces * nSamples) throw new RangeError(`fillGather: data length ${input.data.length} ≠ ${nTraces}×${nSamples}`);
  if (plan.nTraces !== nTraces) throw new RangeError(`fillGather: plan has ${plan.nTraces} positions, gather ${nTraces}`);
  if (input.slopePairs && input.slopePairs.length !== Math.max(0, nTraces - 1) * nSamples)
    throw new RangeError(`fillGather: slope length ${input.slopePairs.length} ≠ (${nTraces}−1)×${nSamples}`);
  const cancel = hooks.cancel;
  const report = (stage: FillStage, fraction: number, solver?: SolverProgress) => hooks.onProgress?.({ stage, fraction, solver });
  const unknown = unknownMask(plan);
  const missingCount = countToFill(plan);
  const d = Float64Array.from(input.data);
  for (let x = 0; x < nTraces; x++) if (unknown[x]) d.fill(0, x * nSamples, (x + 1) * nSamples);
  const base = {
    unknownTraces: unknown, missingCount, solver: settings.solver,
    holdoutKind: 'none' as HoldoutKind, holdoutTraces: [] as number[], secondPass: 'off' as const,
  };
  if (missingCount === 0 || nTraces < 2) {
    return {
      ...base, filled: Float32Array.from(input.data), slopePairs: input.slopePairs ?? new Float64Array(Math.max(0, nTraces - 1) * nSamples),
      iterations: 0, converged: true, seconds: (Date.now() - start) / 1000, holdoutSnrDb: Number.NaN, gapRmsRatio: Number.NaN, fillRmsRatio: Number.NaN, details: {},
    };
  }
  const solve = hooks.solvers?.[settings.solver] ?? BUILTIN_SOLVERS[settings.solver];
  if (!solve) throw new BugError(`fillGather: no solver registered under "${settings.solver}"`);
  const solverSettings = (settings.solver === 'lsq' ? settings.lsq : settings.net) as unknown as Record<string, unknown>;
  const estimator = hooks.estimator ?? slopeEstimator(settings.slope);
  const estimate = (data: Float64Array, unk: Uint8Array, factor: number): Float64Array => {
    return slopesForFill(data, nTraces, nSamples, unk, estimator, factor, cancel);
  };
  const runSolver = async (data: Float64Array, unk: Uint8Array, slopes: Float64Array, stage: FillStage, f0: number, f1: number): Promise<GapSolverResult> => {
    const si: GapSolverInput = {
      data, nTraces, nSamples, unknownTraces: unk, slopePairs: slopes, cancel,
      onProgress: (p) => report(stage, f0 + ((f1 - f0) * p.step) / Math.max(1, p.totalSteps), p),
    };
    return await solve(si, solverSettings);
  };

  // Slopes for the fill and for the hold-out problem.
  report('slopes', 0);
  let slopeProblem = '';
  let slopes1: Float64Array;
  try {
    slopes1 = input.slopePairs ?? estimate(d, unknown, plan.factor);
  } catch (e) {
    // No slopes can be estimated (e.g. no two neighbouring recorded traces, or silent ones): fill with flat
    // slopes, a smooth blend of the neighbours, and say so in the details; the hold-out still scores it.
    if (!isInputFileError(e)) throw e;
    slopeProblem = e.problem.code;
    slopes1 = new Float64Array(Math.max(0, nTraces - 1) * nSamples);
  }
  throwIfCancelled(cancel);
  const design = settings.holdout ? designHoldout(unknown, plan.factor) : { kind: 'none' as HoldoutKind, hidden: [] };
  const unkH = Uint8Array.from(unknown);
  for (const h of design.hidden) unkH[h] = 1;
  const dH = Float64Array.from(d);
  for (const h of design.hidden) dH.fill(0, h * nSamples, (h + 1) * nSamples);
  let slopesH: Float64Array | null = null;
  let holdoutProblem = '';
  if (design.hidden.length) {
    try {
      // Block and single hold-outs re-estimate slopes without the hidden traces (no leak). A decimation hold-out
      // reuses the slopes from all recorded traces: hiding every k-th trace doubles the spacing, and slopes
      // estimated on that 2k grid are far more aliased than the real problem's (measured: 3–11 dB hold-out
      // scores for 42–48 dB fills at k = 3, 4); the fill across the wider hole is still harder than the real one.
      // A block hold-out re-estimates only a window of traces around the hidden block (fill-slopes.ts): the
      // hold-out fill reads slopes only on the pairs beside and inside the block.
      slopesH = input.slopePairs ?? (design.kind === 'decimation' || slopeProblem ? slopes1
        : design.kind === 'block' && plan.factor <= 1 ? holdoutSlopesNearBlock(slopes1, dH, nTraces, nSamples, unkH, design.hidden, estimator, cancel)
        : estimate(dH, unkH, plan.factor));
    } catch (e) {
      // The hidden traces can leave too little to estimate from; the fill itself stands, without a score.
      if (!isInputFileError(e)) throw e;
      holdoutProblem = e.problem.code;
    }
  }
  const details: Record<string, number | string> = { holdoutHidden: design.hidden.length, slopeChoice: input.slopePairs ? 'given' : 'estimated' };
  if (slopeProblem) details.slopeProblem = slopeProblem;
  let chosen: GapSolverResult;
  let slopes = slopes1;
  let holdoutSnr = Number.NaN;
  let fillH: GapSolverResult | null = null;
  if (settings.solver === 'lsq' && slopesH) {
    // Least squares tuned by the hold-out (methods.md §5, leave-out validation; §3.1, stop when the leave-out
    // SNR stops improving): destructor order, estimated or flat slopes (flat wins where the estimate is poor,
    // e.g. incoherent or strongly aliased data: the fill is then a smooth blend of the neighbours), and the CG
    // iteration count (0 = the painted start alone). The score reported is the chosen candidate's.
    const hiddenMask = new Uint8Array(nTraces);
    for (const h of design.hidden) hiddenMask[h] = 1;
    let energy = 0;
    for (const h of design.hidden) for (let t = 0; t < nSamples; t++) energy += d[h * nSamples + t] ** 2;
    const sets = [{ name: input.slopePairs ? 'given' : slopeProblem ? 'flat' : 'estimated', main: slopes1, hold: slopesH }];
    if (!input.slopePairs && !slopeProblem) sets.push({ name: 'flat', main: new Float64Array(slopes1.length), hold: new Float64Array(slopes1.length) });
    const orders = settings.orders.length ? settings.orders : [settings.lsq.order];
    let best: { name: string; main: Float64Array; order: PwdOrder; iterations: number; snr: number; res: GapSolverResult } | null = null;
    let n = 0;
    for (const set of sets) {
      for (const order of orders) {
        throwIfCancelled(cancel);
        const tracker = new IterationTracker(d, hiddenMask);
        const res = solveLeastSquares({ data: dH, nTraces, nSamples, unknownTraces: unkH, slopePairs: set.hold, cancel }, { ...settings.lsq, order }, tracker);
        const b = tracker.best(settings.lsq.maxIterations);
        const snr = energy === 0 ? Number.NaN : b.error === 0 ? Number.POSITIVE_INFINITY : 10 * Math.log10(energy / b.error);
        details[`holdoutSnrDb_${set.name}_order${order}`] = snr;
        if (!best || snr > best.snr) best = { name: set.name, main: set.main, order, iterations: b.iterations, snr, res };
        report('holdout', 0.2 + (0.6 * ++n) / (sets.length * orders.length));
      }
    }
    const pick = best!;
    chosen = solveLeastSquares(
      { data: d, nTraces, nSamples, unknownTraces: unknown, slopePairs: pick.main, cancel, onProgress: (p) => report('fill', 0.8 + (0.2 * p.step) / Math.max(1, p.totalSteps), p) },
      { ...settings.lsq, order: pick.order, maxIterations: pick.iterations },
    );
    slopes = pick.main;
    holdoutSnr = pick.snr;
    fillH = pick.res;
    if (settings.keepAmplitude) {
      // Score what is delivered: the chosen hold-out fill, stopped at the chosen count and lifted like the fill.
      const hold = solveLeastSquares({ data: dH, nTraces, nSamples, unknownTraces: unkH, slopePairs: pick.name === 'flat' ? pick.main : slopesH, cancel }, { ...settings.lsq, order: pick.order, maxIterations: pick.iterations });
      const lifted = Float64Array.from(hold.data);
      liftQuietFills(lifted, unkH, nTraces, nSamples);
      holdoutSnr = snrDb(d, lifted, design.hidden, nSamples);
      details.holdoutSnrDbBeforeLift = pick.snr;
    }
    Object.assign(details, chosen.details, { slopeChoice: pick.name, order: pick.order, iterationsChosenByHoldout: pick.iterations });
  } else {
    chosen = await runSolver(d, unknown, slopes1, 'fill', 0.1, 0.55);
    Object.assign(details, chosen.details);
    if (slopesH) {
      report('holdout', 0.55);
      fillH = await runSolver(dH, unkH, slopesH, 'holdout', 0.6, 1);
      const scored = Float64Array.from(fillH.data);
      if (settings.keepAmplitude) liftQuietFills(scored, unkH, nTraces, nSamples);
      holdoutSnr = snrDb(d, scored, design.hidden, nSamples);
    }
  }
  const fill1 = chosen;
  let second: 'off' | 'kept' | 'rejected' = 'off';
  if (settings.secondPass && !input.slopePairs) {
    // Re-estimate on the filled gather (now without holes, so on the fine grid) and fill again.
    report('second-pass', 0.5);
    const none = new Uint8Array(nTraces);
    const slopes2 = estimate(fill1.data, none, 1);
    const fill2 = await runSolver(d, unknown, slopes2, 'second-pass', 0.55, 0.75);
    let snr2 = Number.NaN;
    if (fillH) {
      const slopesH2 = estimate(fillH.data, none, 1);
      const fillH2 = await runSolver(dH, unkH, slopesH2, 'second-pass', 0.75, 1);
      snr2 = snrDb(d, fillH2.data, design.hidden, nSamples);
    }
    details.firstPassHoldoutSnrDb = holdoutSnr;
    details.secondPassHoldoutSnrDb = snr2;
    if (snr2 > holdoutSnr) {
      chosen = fill2;
      slopes = slopes2;
      holdoutSnr = snr2;
      second = 'kept';
    } else second = 'rejected';
  }

  if (settings.keepAmplitude) {
    const data = Float64Array.from(chosen.data);
    details.largestAmplitudeLift = liftQuietFills(data, unknown, nTraces, nSamples);
    chosen = { ...chosen, data };
  }
  if (holdoutProblem) details.holdoutProblem = holdoutProblem;
  const filled = Float32Array.from(input.data);
  for (let x = 0; x < nTraces; x++) {
    if (!unknown[x]) continue;
    for (let t = 0; t < nSamples; t++) filled[x * nSamples + t] = chosen.data[x * nSamples + t];
  }
  report('fill', 1);
  return {
    ...base,
    filled,
    slopePairs: slopes,
    iterations: chosen.iterations,
    converged: chosen.converged,
    seconds: (Date.now() - start) / 1000,
    holdoutSnrDb: holdoutSnr,
    holdoutKind: design.kind,
    holdoutTraces: design.hidden,
    gapRmsRatio: gapRmsRatio(chosen.data, unknown, nSamples),
    fillRmsRatio: fillRmsRatio(chosen.data, unknown, nSamples),
    secondPass: second,
    details,
  };
}
