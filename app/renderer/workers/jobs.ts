/**
 * The long computations of the core worker that need no open file: slope estimation, the fill with its
 * hold-out check, and spectra. Each handler takes plain data and returns plain data (workers/protocol.ts).
 */
import type { CancelToken } from '../../../core/problems';
import { estimateSlopes } from '../../../core/slope/estimate';
import type { SlopeOptions as CoreSlopeOptions } from '../../../core/slope/types';
import { fillGather, type FillSettings as CoreFillSettings } from '../../../core/fill/pipeline';
import { slopeEstimator, type SlopeEstimator } from '../../../core/fill/fill-slopes';
import { LSQ_DEFAULTS } from '../../../core/fill/lsq';
import { solveGapsNet } from '../../../core/nn/solver';
import { unknownBlocks } from '../../../core/fill/plan';
import { fkSpectrum, meanAmplitude, toDb } from '../analysis/spectra';
import { alignReference } from '../analysis/reference';
import { InputFileError } from '../../../core/problems';
import { openSegy } from '../../../core/segy/open';
import { indexGathers, parseGatherKey, readGather } from '../../../core/segy/gathers';
import { gatherGeometry } from '../../../core/segy/geometry';
import { gatherOnGrid } from '../../../core/fill/gather-grid';
import { blobByteSource } from '../io/blob-source';
import type { Api, ApiName, FillSettings, SlopeOptions } from './protocol';

type Handler<K extends ApiName> = (payload: Api[K]['req'], cancel: CancelToken, progress: (p: Api[K]['progress']) => void) => Promise<{ result: Api[K]['res']; transfer?: Transferable[] }>;

export function coreSlopeOptions(o: SlopeOptions): CoreSlopeOptions {
  return { method: o.method, radiusTimeSamples: o.radiusTimeSamples, radiusTraces: o.radiusTraces, order: o.order };
}

export function coreFillSettings(s: FillSettings): Partial<CoreFillSettings> {
  return {
    solver: s.solver,
    lsq: { ...LSQ_DEFAULTS, maxIterations: s.maxIterations, tolerance: s.tolerance },
    net: { steps: s.steps, seed: s.seed },
    holdout: s.holdout,
    secondPass: s.secondPass,
  };
}

/** A slope estimator for the fill pipeline with the user's settings (used when no field was estimated first). */
export function estimatorFor(options: SlopeOptions): SlopeEstimator {
  return slopeEstimator(coreSlopeOptions(options));
}

export const JOBS: { [K in ApiName]?: Handler<K> } = {
  async slopes(p, cancel) {
    const t0 = performance.now();
    const live = new Uint8Array(p.nTraces);
    for (let x = 0; x < p.nTraces; x++) live[x] = p.unknown[x] ? 0 : 1;
    const f = estimateSlopes(p.data, p.nTraces, p.nSamples, live, coreSlopeOptions(p.options), cancel);
    const i = f.info;
    const gaps = unknownBlocks(p.unknown).map(([a, b]) => {
      let s = 0, n = 0;
      for (let x = a; x <= b; x++) for (let t = 0; t < p.nSamples; t++) { s += f.confidence[x * p.nSamples + t]; n++; }
      return { firstTrace: a, lastTrace: b, meanConfidence: n ? s / n : 0 };
    });
    const description = `${i.method === 'pwd' ? `plane-wave destruction, ${i.order === 1 ? '3' : '5'}-point filter` : 'gradient structure tensor'}; ` +
      `smoothing radii ${i.radiusTimeSamples} samples × ${i.radiusTraces} traces` +
      (i.decimationFactor > 1 ? `; estimated on the coarse grid (every ${i.decimationFactor}th trace)` : '') +
      (i.lowpassCyclesPerSample < 0.5 ? `, low-passed below ${(i.lowpassCyclesPerSample / (p.dtSeconds)).toFixed(1)} Hz` : '') +
      (i.timeLevels > 0 ? `; ${i.timeLevels} coarse-to-fine time level${i.timeLevels > 1 ? 's' : ''}` : '') +
      (i.method === 'pwd' ? `; destruction residual energy ${(100 * i.residualStart).toFixed(0)}% → ${(100 * i.residualEnd).toFixed(0)}% of the balanced data energy on the finest Gauss-Newton level` : '');
    const result = {
      slopePairs: f.estimatePairs, slopeTraces: f.slopeTraces, confidence: f.confidence,
      seconds: (performance.now() - t0) / 1000, description, gaps,
    };
    return { result, transfer: [result.slopePairs.buffer, result.slopeTraces.buffer, result.confidence.buffer] };
  },

  async fill(p, cancel, progress) {
    const r = await fillGather(
      { data: p.data, nTraces: p.nTraces, nSamples: p.nSamples, plan: p.plan, slopePairs: p.slopePairs ?? undefined },
      coreFillSettings(p.settings),
      {
        cancel, onProgress: progress, estimator: estimatorFor(p.slopeOptions),
        solvers: { net: (input, settings) => solveGapsNet(input, settings) },
      },
    );
    const result = {
      data: r.filled, holdoutSnrDb: Number.isNaN(r.holdoutSnrDb) ? null : r.holdoutSnrDb,
      holdoutDescription: holdoutWords(r.holdoutKind, r.holdoutTraces) + (p.slopePairs
        ? ' The check used the dip field on screen, which was estimated with the hidden traces present, so the score may lean optimistic.'
        : ' Slopes were estimated again without the hidden traces, as for the real gap.'),
      holdoutTraces: r.holdoutTraces,
      gapRmsRatio: Number.isFinite(r.gapRmsRatio) ? r.gapRmsRatio : null,
      iterations: r.iterations, seconds: r.seconds, solver: r.solver, converged: r.converged, secondPass: r.secondPass,
      slopePairs: r.slopePairs,
      details: r.details,
    };
    return { result, transfer: [result.data.buffer] };
  },

  async reference(p, cancel) {
    const file = await openSegy(blobByteSource(p.name, p.blob));
    const refuse = (message: string, found: string, hint: string) =>
      new InputFileError({ code: 'input.bad-argument', severity: 'error', file: p.name, message, found, hint });
    if (file.nSamples !== p.nSamples) throw refuse('the reference file has another trace length.', `${file.nSamples} samples`, `Expected ${p.nSamples} samples, as on screen.`);
    const index = await indexGathers(file, parseGatherKey(p.key), { cancel });
    const at = index.gathers.findIndex((g) => g.keyValue === p.keyValue);
    if (at < 0) throw refuse(`the reference file has no gather with key value ${p.keyValue}.`, `${index.gathers.length} gathers`, 'Choose the reference of the same line and the same gather key.');
    const g = await readGather(file, index, at, { cancel });
    const geo = gatherGeometry(g.headers, g.data, g.nSamples);
    const ref = gatherOnGrid(g.data, geo, g.nSamples);
    const nRef = geo.gridCount;
    const ns = p.nSamples;
    const { shift: best, misfit: bestMis } = alignReference(p.data, p.present, p.nTraces, ref, nRef, ns);
    // The recorded traces must be the same recordings (up to sample encoding): 1 % relative RMS at most.
    if (best < 0 || !(bestMis < 0.01))
      throw refuse('the reference does not line up with the gather on screen: its traces differ from the recorded ones.', best < 0 ? `${nRef} reference positions for ${p.nTraces} on screen` : `relative misfit ${(100 * bestMis).toFixed(1)} % at the best shift`, 'A reference must hold the same recordings as the recorded traces on screen (a synthetic test\'s complete version).');
    const data = ref.slice(best * ns, (best + p.nTraces) * ns);
    return { result: { data, shift: best, mismatch: bestMis, referenceTraces: nRef }, transfer: [data.buffer] };
  },

  async spectra(p) {
    const before = meanAmplitude(p.before, p.nSamples, p.liveTraces, p.dtSeconds);
    const after = p.after ? meanAmplitude(p.after, p.nSamples, [...p.liveTraces, ...p.filledTraces].sort((a, b) => a - b), p.dtSeconds) : null;
    const ref = Math.max(...before.amplitude, ...(after ? after.amplitude : [0]));
    const fb = fkSpectrum(p.before, p.nTraces, p.nSamples, p.dtSeconds, p.spacingM);
    const fa = p.after ? fkSpectrum(p.after, p.nTraces, p.nSamples, p.dtSeconds, p.spacingM) : null;
    const pack = (f: typeof fb) => ({ amplitude: f.amplitude, nK: f.nK, nF: f.nF, wavenumber: f.wavenumber, frequencyHz: f.frequencyHz, unit: f.wavenumberUnit });
    return {
      result: {
        frequencyHz: before.frequencyHz, beforeDb: toDb(before.amplitude, ref), afterDb: after ? toDb(after.amplitude, ref) : null,
        fkBefore: pack(fb), fkAfter: fa ? pack(fa) : null,
      },
    };
  },
};

function holdoutWords(kind: string, hidden: readonly number[]): string {
  const n = hidden.length;
  switch (kind) {
    case 'block': return `${n} recorded traces next to the gap (positions ${hidden[0] + 1}–${hidden[n - 1] + 1}) were hidden, filled the same way, and compared with their recordings.`;
    case 'decimation': return `every few recorded traces (${n} in all) were hidden, filled the same way, and compared with their recordings; hiding them doubles the distance to their neighbours, so the score leans pessimistic.`;
    case 'single': return `${n} isolated recorded traces were hidden, filled the same way, and compared with their recordings.`;
    default: return 'No recorded traces could be hidden for a check.';
  }
}
