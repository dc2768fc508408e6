/**
 * The coordinate-network gap solver: meets core/fill/solver.ts (GapSolverInput → GapSolverResult).
 * Plans one training job per (run of missing traces × time window), runs them through a NetJobRunner (in this
 * thread by default; app/host/net-pool.ts runs them on worker_threads, a Web Worker runner can do the same),
 * and blends the fills in. Known traces are copied unchanged.
 */
import type { GapSolverFn, GapSolverInput, GapSolverResult, SolverProgress } from '../fill/solver';
import { solveLeastSquares } from '../fill/lsq';
import { CancelledError, InputFileError, type CancelToken } from '../problems';
import { trainNetWindow, type NetTrainOptions } from './train';
import { blendNetWindows, planNetWindows, type NetWindowFill, type NetWindowJob } from './window';

export interface NetSolverOptions extends Partial<NetTrainOptions> {
  seed?: number;
  /** Live traces kept on each side of a run of missing traces. */
  marginTraces?: number;
  /** Time-window length and overlap (samples) for long traces. */
  windowSamples?: number;
  overlapSamples?: number;
  /** Start from the least-squares fill (core/fill/lsq.ts) as a fading prior on the missing traces, or not. */
  start?: 'lsq' | 'none';
  /** Total wall-clock budget for the whole fill (seconds), shared evenly between jobs. */
  timeBudgetSeconds?: number;
}

export const NET_DEFAULTS: Required<Omit<NetSolverOptions, 'timeBudgetSeconds'>> & { timeBudgetSeconds: number } = {
  width: 32,
  depth: 2,
  activation: 'sin',
  nFreq: 24,
  features: 'dip',
  featureSpread: 0.1,
  steps: 600,
  lambda: 'auto',
  learningRate: 2e-2,
  learningRateFinalFraction: 0.1,
  warmupSteps: 50,
  priorWeight: 1,
  start: 'none',
  batchData: 384,
  batchColloc: 384,
  timeBudgetSeconds: Infinity,
  seed: 1,
  marginTraces: 8,
  windowSamples: 160,
  overlapSamples: 32,
};

/** Progress of one job, forwarded by a runner. */
export interface NetJobProgress {
  jobIndex: number;
  step: number;
  totalSteps: number;
  terms: Record<string, number>;
}

/** Runs training jobs; results in any order. Must throw CancelledError when the token is set. */
export type NetJobRunner = (
  jobs: NetWindowJob[], options: NetTrainOptions, cancel: CancelToken | undefined, onJobProgress: (p: NetJobProgress) => void,
) => Promise<NetWindowFill[]>;

/** Resolves and validates options (bad values are the user's input: InputFileError 'input.bad-argument'). */
export function resolveNetOptions(options: NetSolverOptions = {}): typeof NET_DEFAULTS {
  for (const key of Object.keys(options)) {
    if (!(key in NET_DEFAULTS))
      throw new InputFileError({ code: 'input.bad-argument', severity: 'error', message: 'Unknown network solver setting.', field: key, expected: Object.keys(NET_DEFAULTS).join(', ') });
  }
  const o = { ...NET_DEFAULTS, ...Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) } as typeof NET_DEFAULTS;
  const bad = (field: string, found: unknown, expected: string): never => {
    throw new InputFileError({ code: 'input.bad-argument', severity: 'error', message: `Network solver option ${field} is out of range.`, field, found: String(found), expected });
  };
  const int = (field: keyof typeof NET_DEFAULTS, lo: number, hi: number) => {
    const v = o[field] as number;
    if (!Number.isInteger(v) || v < lo || v > hi) bad(field, v, `an integer from ${lo} to ${hi}`);
  };
  int('width', 4, 256);
  int('depth', 1, 6);
  int('nFreq', 1, 256);
  int('steps', 0, 1_000_000);
  int('warmupSteps', 0, 1_000_000);
  int('batchData', 1, 1_000_000);
  int('batchColloc', 1, 1_000_000);
  int('marginTraces', 1, 10_000);
  int('windowSamples', 8, 1_000_000);
  int('overlapSamples', 0, 1_000_000);
  if (o.overlapSamples >= o.windowSamples) bad('overlapSamples', o.overlapSamples, `less than windowSamples (${o.windowSamples})`);
  if (o.lambda !== 'auto' && !(typeof o.lambda === 'number' && Number.isFinite(o.lambda) && o.lambda >= 0)) bad('lambda', o.lambda, "'auto' or a number ≥ 0");
  if (!(o.learningRate > 0 && o.learningRate < 1)) bad('learningRate', o.learningRate, 'a number in (0, 1)');
  if (!(o.learningRateFinalFraction > 0 && o.learningRateFinalFraction <= 1)) bad('learningRateFinalFraction', o.learningRateFinalFraction, 'a number in (0, 1]');
  if (!(o.timeBudgetSeconds > 0)) bad('timeBudgetSeconds', o.timeBudgetSeconds, 'a positive number of seconds');
  if (o.activation !== 'sin' && o.activation !== 'tanh') bad('activation', o.activation, "'sin' or 'tanh'");
  if (o.features !== 'dip' && o.features !== 'isotropic') bad('features', o.features, "'dip' or 'isotropic'");
  if (o.start !== 'lsq' && o.start !== 'none') bad('start', o.start, "'lsq' or 'none'");
  if (!(o.featureSpread >= 0 && o.featureSpread <= 100)) bad('featureSpread', o.featureSpread, 'a number from 0 to 100');
  if (!(o.priorWeight >= 0 && Number.isFinite(o.priorWeight))) bad('priorWeight', o.priorWeight, 'a number ≥ 0');
  if (!Number.isInteger(o.seed)) bad('seed', o.seed, 'an integer');
  return o;
}

/** The in-thread runner: jobs one after another, yielding to the host between steps when it can. */
export const runNetJobsInThread: NetJobRunner = async (jobs, options, cancel, onJobProgress) => {
  const st = (globalThis as { setTimeout?: (f: () => void, ms: number) => unknown }).setTimeout;
  const yieldToHost = st ? () => new Promise<void>((r) => st(r, 0)) : undefined;
  const out: NetWindowFill[] = [];
  for (const job of jobs) {
    out.push(await trainNetWindow(job, options, {
      cancel, yieldToHost, yieldEvery: 4, progressEvery: 10,
      onStep: (step, totalSteps, terms) => onJobProgress({ jobIndex: job.index, step, totalSteps, terms }),
    }));
  }
  return out;
};

function checkInput(input: GapSolverInput): void {
  const { data, nTraces, nSamples, unknownTraces, slopePairs } = input;
  const bad = (field: string, found: string | number, expected: string) => {
    throw new InputFileError({ code: 'input.bad-argument', severity: 'error', message: `Gap solver input ${field} does not fit the gather.`, field, found, expected });
  };
  if (!Number.isInteger(nTraces) || !Number.isInteger(nSamples) || nTraces < 1 || nSamples < 1) bad('shape', `${nTraces}×${nSamples}`, 'positive integers');
  if (data.length !== nTraces * nSamples) bad('data', data.length, `nTraces·nSamples = ${nTraces * nSamples}`);
  if (unknownTraces.length !== nTraces) bad('unknownTraces', unknownTraces.length, `${nTraces}`);
  if (slopePairs.length !== Math.max(0, nTraces - 1) * nSamples) bad('slopePairs', slopePairs.length, `(nTraces−1)·nSamples = ${(nTraces - 1) * nSamples}`);
  let nKnown = 0;
  for (let x = 0; x < nTraces; x++) if (!unknownTraces[x]) nKnown++;
  if (nKnown === 0) bad('unknownTraces', 'all traces unknown', 'at least one live trace');
  for (let x = 0; x < nTraces; x++) {
    if (unknownTraces[x]) continue;
    for (let t = 0; t < nSamples; t++) {
      if (!Number.isFinite(data[x * nSamples + t])) {
        throw new InputFileError({ code: 'input.bad-argument', severity: 'error', message: 'A live sample is not a finite number.', traceIndex: x, field: `sample ${t}`, found: String(data[x * nSamples + t]), expected: 'a finite number' });
      }
    }
  }
  for (let i = 0; i < slopePairs.length; i++) {
    if (!Number.isFinite(slopePairs[i]))
      throw new InputFileError({ code: 'input.bad-dips', severity: 'error', message: 'A slope is not a finite number.', traceIndex: Math.floor(i / nSamples), field: `sample ${i % nSamples}`, found: String(slopePairs[i]), expected: 'finite slopes in samples per trace' });
  }
}

/**
 * Fills the unknown traces of one gather with coordinate networks. Known traces are copied unchanged.
 * @param runner how jobs run (default: this thread; app/host/net-pool.ts: worker_threads)
 * @param jobsInParallel how many jobs the runner runs at once (only used to share the time budget)
 */
export async function solveGapsNet(input: GapSolverInput, options: NetSolverOptions = {}, runner: NetJobRunner = runNetJobsInThread, jobsInParallel = 1): Promise<GapSolverResult> {
  const tStart = Date.now() / 1000;
  checkInput(input);
  const o = resolveNetOptions(options);
  const { data, nTraces, nSamples, unknownTraces, slopePairs } = input;
  const out = Float64Array.from(data);
  const prior = o.start === 'lsq' ? solveLeastSquares({ data, nTraces, nSamples, unknownTraces, slopePairs, cancel: input.cancel }).data : null;
  const jobs = planNetWindows(data, nTraces, nSamples, unknownTraces, slopePairs, o, prior);
  const waves = Math.max(1, Math.ceil(jobs.length / Math.max(1, jobsInParallel)));
  const train: NetTrainOptions = { ...o, timeBudgetSeconds: o.timeBudgetSeconds / waves };
  const stepsDone = new Float64Array(jobs.length);
  const totalSteps = jobs.length * o.steps;
  const onJobProgress = (p: NetJobProgress) => {
    stepsDone[p.jobIndex] = p.step;
    if (!input.onProgress) return;
    let done = 0;
    for (let i = 0; i < stepsDone.length; i++) done += stepsDone[i];
    const elapsed = Date.now() / 1000 - tStart;
    const left = done > 0 ? Math.min(elapsed * (totalSteps - done) / done, Math.max(0, o.timeBudgetSeconds - elapsed)) : Number.NaN;
    const progress: SolverProgress = { step: done, totalSteps, terms: { ...p.terms, window: p.jobIndex }, elapsedSeconds: elapsed, secondsLeft: left };
    input.onProgress(progress);
  };
  if (input.cancel?.cancelled) throw new CancelledError();
  const fills = jobs.length ? await runner(jobs, train, input.cancel, onJobProgress) : [];
  for (let x = 0; x < nTraces; x++) if (unknownTraces[x]) out.fill(0, x * nSamples, (x + 1) * nSamples);
  blendNetWindows(out, nSamples, jobs, fills, o.overlapSamples);
  // Known traces untouched, bit for bit.
  for (let x = 0; x < nTraces; x++) if (!unknownTraces[x]) out.set(data.subarray(x * nSamples, (x + 1) * nSamples), x * nSamples);
  let steps = 0;
  let budgetStops = 0;
  let silent = 0;
  let dataSum = 0;
  let pdeSum = 0;
  for (const f of fills) {
    steps += f.steps;
    budgetStops += f.terms.budgetStop ?? 0;
    silent += f.terms.silent ?? 0;
    dataSum += Number.isFinite(f.terms.data) ? f.terms.data : 0;
    pdeSum += Number.isFinite(f.terms.pde) ? f.terms.pde : 0;
  }
  return {
    data: out,
    iterations: steps,
    converged: budgetStops === 0,
    seconds: Date.now() / 1000 - tStart,
    details: {
      solver: 'net',
      windows: jobs.length,
      trainingSteps: steps,
      windowsStoppedByBudget: budgetStops,
      silentWindows: silent,
      meanDataMisfit: fills.length ? dataSum / fills.length : 0,
      meanPlaneWaveResidual: fills.length ? pdeSum / fills.length : 0,
      width: o.width, depth: o.depth, seed: o.seed,
      note: 'filled traces are estimates, not recordings',
    },
  };
}

/** The network solver in the shape core/fill/pipeline.ts expects (in this thread; settings validated). */
export const netGapSolver: GapSolverFn = (input, settings) => solveGapsNet(input, settings as NetSolverOptions);
