/**
 * Trains one coordinate network on one window job (core/nn/window.ts) and returns the fill of its missing traces.
 *
 * Loss (methods.md §4.1, after Raissi et al. 2019): mean (u − d)² over live samples + λ · mean (u_x̃ + σ̃ u_t̃)²
 * over collocation points that are re-drawn every step with continuous (jittered) positions: three quarters inside
 * the gap (between the last live trace before it and the first after it), one quarter over the whole window.
 * λ 'auto' balances the two gradient norms with a running average (learning-rate annealing of Wang, Teng &
 * Perdikaris 2021, SIAM J. Sci. Comput. 43(5); we use the ratio of L2 norms rather than max/mean).
 * Adam (Kingma & Ba 2015) with an exponentially decaying learning rate; an optional warm-up on the data term.
 * Data are divided by the RMS of the window's live samples; σ is rescaled to the window's coordinates.
 */
import { CancelledError, type CancelToken } from '../problems';
import { Rng } from '../rng';
import { adamStep, createAdam } from './adam';
import { drawFeatureFrequencies, meanAmplitudeSpectrum, type FeatureMode } from './features';
import { allocNetBatch, forwardValue, netBatchGradient } from './kernel';
import { buildNetModel, createNetScratch, initNetParams, type Activation } from './network';
import type { NetWindowFill, NetWindowJob } from './window';

export interface NetTrainOptions {
  width: number;
  depth: number;
  activation: Activation;
  /** Number of Fourier frequencies (2× as many features). */
  nFreq: number;
  features: FeatureMode;
  /** Random spread of the features' x̃ frequencies, cycles per unit x̃ (see core/nn/features.ts). */
  featureSpread: number;
  steps: number;
  /** Fixed λ (data normalised to unit RMS, coordinates in [−1, 1]) or 'auto'. */
  lambda: number | 'auto';
  learningRate: number;
  /** Final learning rate as a fraction of the first (exponential decay in between). */
  learningRateFinalFraction: number;
  /** Steps on the data term alone before the plane-wave term is switched on. */
  warmupSteps: number;
  batchData: number;
  batchColloc: number;
  /**
   * Weight of the prior fill (job.prior, e.g. the least-squares fill) as extra data on the missing traces,
   * relative to a live sample; it decays linearly to zero over the run (0 = no prior).
   */
  priorWeight: number;
  /** Wall-clock seconds this job may use (Infinity for none); training stops early, the fill is still produced. */
  timeBudgetSeconds: number;
}

export interface NetTrainHooks {
  cancel?: CancelToken;
  /** Called every `progressEvery` steps and at the end. */
  onStep?: (step: number, totalSteps: number, terms: Record<string, number>) => void;
  progressEvery?: number;
  /** Monotonic clock in seconds (performance.now()/1000 or similar); defaults to Date.now()/1000. */
  now?: () => number;
  /** Lets the host run other tasks (cancel messages) between steps. */
  yieldEvery?: number;
  yieldToHost?: () => Promise<void>;
  /** Diagnostic only: called with the fill so far, e.g. to record SNR against steps in benchmarks. */
  onSnapshot?: (step: number, fill: Float64Array) => void;
  snapshotEvery?: number;
}

/** Fills `out` ((fillEnd−fillStart)·nSamples) with the network's values on the grid, in data units. */
function predictFill(out: Float64Array, job: NetWindowJob, evalAt: (tN: number, xN: number) => number, scale: number): Float64Array {
  const sT = 2 / Math.max(1, job.nSamples - 1);
  const sX = 2 / Math.max(1, job.nTraces - 1);
  for (let x = job.fillStart; x < job.fillEnd; x++) {
    for (let t = 0; t < job.nSamples; t++) out[(x - job.fillStart) * job.nSamples + t] = scale * evalAt(t * sT - 1, x * sX - 1);
  }
  return out;
}

/** Bilinear slope on the pair grid at continuous (t, x) in window samples/traces (pair p sits at x = p + ½). */
function slopeAt(sp: Float64Array, nPairs: number, nSamples: number, t: number, x: number): number {
  if (nPairs <= 0) return 0;
  let q = x - 0.5;
  q = q < 0 ? 0 : q > nPairs - 1 ? nPairs - 1 : q;
  const tt = t < 0 ? 0 : t > nSamples - 1 ? nSamples - 1 : t;
  const p0 = Math.min(Math.floor(q), nPairs - 1);
  const p1 = Math.min(p0 + 1, nPairs - 1);
  const t0 = Math.min(Math.floor(tt), nSamples - 1);
  const t1 = Math.min(t0 + 1, nSamples - 1);
  const fq = q - p0;
  const ft = tt - t0;
  const a = sp[p0 * nSamples + t0] * (1 - ft) + sp[p0 * nSamples + t1] * ft;
  const b = sp[p1 * nSamples + t0] * (1 - ft) + sp[p1 * nSamples + t1] * ft;
  return a * (1 - fq) + b * fq;
}

export async function trainNetWindow(job: NetWindowJob, o: NetTrainOptions, hooks: NetTrainHooks = {}): Promise<NetWindowFill> {
  const now = hooks.now ?? (() => Date.now() / 1000);
  const t0 = now();
  const { nTraces, nSamples, known, data } = job;
  const nFill = job.fillEnd - job.fillStart;
  const fill = new Float64Array(nFill * nSamples);

  let sumSq = 0;
  let nLive = 0;
  for (let x = 0; x < nTraces; x++) {
    if (!known[x]) continue;
    nLive++;
    for (let t = 0; t < nSamples; t++) sumSq += data[x * nSamples + t] ** 2;
  }
  const rms = nLive ? Math.sqrt(sumSq / (nLive * nSamples)) : 0;
  if (rms === 0 || nSamples < 2 || nTraces < 2) {
    // Nothing to learn from: the fill stays zero (the caller reports it).
    return { index: job.index, fill, steps: 0, seconds: now() - t0, terms: { data: 0, pde: 0, lambda: 0, silent: 1 } };
  }

  const rng = new Rng(job.seed);
  const spectrum = meanAmplitudeSpectrum(new Float64Array(Math.floor(nSamples / 2) + 1), data, known, nTraces, nSamples);
  // Slopes for the features are drawn where live data have energy: weight of pair (p, t) = energy of its live traces.
  const slopeWeights = new Float64Array(job.slopePairs.length);
  for (let p = 0; p < nTraces - 1; p++) {
    for (let t = 0; t < nSamples; t++) {
      let e = 0;
      if (known[p]) e += data[p * nSamples + t] ** 2;
      if (known[p + 1]) e += data[(p + 1) * nSamples + t] ** 2;
      slopeWeights[p * nSamples + t] = e;
    }
  }
  const { omegaT, omegaX } = drawFeatureFrequencies({
    nFreq: o.nFreq, mode: o.features, nTraces, nSamples, slopes: job.slopePairs, slopeWeights, spectrum, nSpectrum: nSamples, spreadCycles: o.featureSpread, seed: rng.int(0, 2 ** 31),
  });
  const model = buildNetModel({ width: o.width, depth: o.depth, activation: o.activation }, omegaT, omegaX);
  const params = initNetParams(model, rng.int(0, 2 ** 31));
  const scratch = createNetScratch(model);
  const adam = createAdam(model.nParams);
  const gData = new Float64Array(model.nParams);
  const gPde = new Float64Array(model.nParams);
  const grad = new Float64Array(model.nParams);
  const sums = new Float64Array(2);

  // Live sample positions (scaled) and targets (normalised).
  const sT = 2 / (nSamples - 1);
  const sX = 2 / (nTraces - 1);
  const nLiveSamples = nLive * nSamples;
  const liveT = new Float64Array(nLiveSamples);
  const liveX = new Float64Array(nLiveSamples);
  const liveD = new Float64Array(nLiveSamples);
  let k = 0;
  for (let x = 0; x < nTraces; x++) {
    if (!known[x]) continue;
    for (let t = 0; t < nSamples; t++, k++) {
      liveT[k] = t * sT - 1;
      liveX[k] = x * sX - 1;
      liveD[k] = data[x * nSamples + t] / rms;
    }
  }
  const nData = Math.min(o.batchData, nLiveSamples);
  const nColloc = o.batchColloc;
  const prior = job.prior && o.priorWeight > 0 ? job.prior : null;
  const nPriorSamples = prior ? nFill * nSamples : 0;
  const nPrior = prior ? Math.min(nPriorSamples, Math.max(1, nData >> 1)) : 0;
  const batch = allocNetBatch(nData + nPrior, nColloc, true);
  batch.nData = nData + nPrior;
  batch.dataWeight!.fill(1);
  const sumsPrior = new Float64Array(2);
  batch.nColloc = nColloc;
  const slopeScale = (nTraces - 1) / (nSamples - 1);
  const nPairs = nTraces - 1;
  // Gap span for collocation: from the last live trace before the run to the first one after it.
  const gx0 = Math.max(0, job.fillStart - 1);
  const gx1 = Math.min(nTraces - 1, job.fillEnd);

  let lambda = o.lambda === 'auto' ? 1 : o.lambda;
  let lambdaInit = o.lambda !== 'auto';
  const decay = Math.log(Math.max(1e-6, o.learningRateFinalFraction)) / Math.max(1, o.steps);
  const progressEvery = hooks.progressEvery ?? 25;
  const yieldEvery = hooks.yieldEvery ?? 1;
  let step = 0;
  let dataMse = NaN;
  let pdeMse = NaN;
  let budgetStop = 0;
  for (; step < o.steps; step++) {
    if (hooks.cancel?.cancelled) throw new CancelledError();
    if (now() - t0 > o.timeBudgetSeconds) {
      budgetStop = 1;
      break;
    }
    // Data minibatch: a random subset of live samples (all of them when the batch is large enough).
    if (nData === nLiveSamples) {
      batch.dataT.set(liveT);
      batch.dataX.set(liveX);
      batch.dataTarget.set(liveD);
    } else {
      for (let i = 0; i < nData; i++) {
        const j = rng.int(0, nLiveSamples);
        batch.dataT[i] = liveT[j];
        batch.dataX[i] = liveX[j];
        batch.dataTarget[i] = liveD[j];
      }
    }
    if (prior) {
      const mu = o.priorWeight * (1 - step / Math.max(1, o.steps));
      for (let i = nData; i < nData + nPrior; i++) {
        const j = rng.int(0, nPriorSamples);
        const x = job.fillStart + Math.floor(j / nSamples);
        const t = j % nSamples;
        batch.dataT[i] = t * sT - 1;
        batch.dataX[i] = x * sX - 1;
        batch.dataTarget[i] = prior[j] / rms;
        batch.dataWeight![i] = mu;
      }
    }
    const warm = step < o.warmupSteps;
    const nC = warm ? 0 : nColloc;
    for (let i = 0; i < nC; i++) {
      const t = rng.uniform() * (nSamples - 1);
      const x = i < (3 * nC) >> 2 ? gx0 + rng.uniform() * (gx1 - gx0) : rng.uniform() * (nTraces - 1);
      batch.collocT[i] = t * sT - 1;
      batch.collocX[i] = x * sX - 1;
      batch.collocSlope[i] = slopeAt(job.slopePairs, nPairs, nSamples, t, x) * slopeScale;
    }
    sums.fill(0);
    gData.fill(0);
    gPde.fill(0);
    netBatchGradient(sums, gData, gPde, model, params, batch, 0, nData, 0, nC, scratch);
    if (nPrior) netBatchGradient(sumsPrior, gData, gPde, model, params, batch, nData, nData + nPrior, 0, 0, scratch);
    dataMse = sums[0] / nData;
    if (nC > 0) pdeMse = sums[1] / nC;
    let nd = 0;
    let np = 0;
    for (let i = 0; i < grad.length; i++) {
      gData[i] /= nData;
      nd += gData[i] * gData[i];
      if (nC > 0) {
        gPde[i] /= nC;
        np += gPde[i] * gPde[i];
      }
    }
    if (o.lambda === 'auto' && nC > 0 && np > 0) {
      const target = Math.sqrt(nd / np);
      lambda = lambdaInit ? 0.9 * lambda + 0.1 * target : target;
      lambdaInit = true;
    }
    const lam = nC > 0 ? lambda : 0;
    for (let i = 0; i < grad.length; i++) grad[i] = gData[i] + lam * gPde[i];
    adamStep(params, grad, adam, o.learningRate * Math.exp(decay * step));
    if (hooks.onStep && (step % progressEvery === 0)) hooks.onStep(step, o.steps, { data: dataMse, pde: pdeMse, lambda: lam });
    if (hooks.onSnapshot && hooks.snapshotEvery && (step + 1) % hooks.snapshotEvery === 0)
      hooks.onSnapshot(step + 1, predictFill(fill, job, (tn, xn) => forwardValue(model, params, scratch, tn, xn), rms));
    if (hooks.yieldToHost && (step + 1) % yieldEvery === 0) await hooks.yieldToHost();
  }
  if (hooks.cancel?.cancelled) throw new CancelledError();
  predictFill(fill, job, (tn, xn) => forwardValue(model, params, scratch, tn, xn), rms);
  const terms = { data: dataMse, pde: pdeMse, lambda, budgetStop };
  hooks.onStep?.(step, o.steps, terms);
  return { index: job.index, fill, steps: step, seconds: now() - t0, terms };
}
