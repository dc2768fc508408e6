/** Analytic test gathers for slope tests (core/synth/events.ts; methods.md §6.3–6.6). */
import { Rng } from '../../../../core/rng';
import { addHyperbola, addPlaneWave, hyperbolaSlopeField, hyperbolaTime, type HyperbolaSpec } from '../../../../core/synth/events';

/** 40 plane waves of one slope at random times and amplitudes (a non-periodic train, so no slope ambiguity). */
export function planeWaveGather(nTraces: number, nSamples: number, slope: number, fp: number, seed = 7): Float64Array {
  const u = new Float64Array(nTraces * nSamples);
  const rng = new Rng(seed);
  for (let e = 0; e < 40; e++)
    addPlaneWave(u, nTraces, nSamples, { t0Samples: rng.uniform() * (nSamples + Math.abs(slope) * nTraces) - (slope > 0 ? slope * nTraces : 0), slopeSamplesPerTrace: slope, fpCyclesPerSample: fp, amplitude: rng.normal() });
  return u;
}

/** The NMO hyperbolas of methods.md §6.6: v = 0.5 traces/sample, t0 = 100, 200, 300, apex at trace 0. */
export const HYPERBOLAS: HyperbolaSpec[] = [100, 200, 300].map((t0) => ({ t0Samples: t0, velocityTracesPerSample: 0.5, apexTrace: 0, fpCyclesPerSample: 0.08 }));

export function hyperbolaGather(nTraces: number, nSamples: number, events = HYPERBOLAS): Float64Array {
  const u = new Float64Array(nTraces * nSamples);
  for (const e of events) addHyperbola(u, nTraces, nSamples, e);
  return u;
}

/** Exact slopes at the pair positions p + ½. */
export function exactPairSlopes(nTraces: number, nSamples: number, events = HYPERBOLAS): Float64Array {
  return hyperbolaSlopeField(new Float64Array((nTraces - 1) * nSamples), Array.from({ length: nTraces - 1 }, (_, p) => p + 0.5), nSamples, events);
}

/** Absolute slope errors within ±3 samples of each event at pair columns pFrom..pTo. */
export function errorsAlongEvents(est: Float64Array, exact: Float64Array, nSamples: number, pFrom: number, pTo: number, events = HYPERBOLAS): number[] {
  const out: number[] = [];
  for (let p = pFrom; p <= pTo; p++)
    for (const e of events) {
      const tt = Math.round(hyperbolaTime(e, p + 0.5));
      for (let t = tt - 3; t <= tt + 3; t++) if (t >= 0 && t < nSamples) out.push(Math.abs(est[p * nSamples + t] - exact[p * nSamples + t]));
    }
  return out;
}

export const median = (a: number[]): number => { const b = a.slice().sort((x, y) => x - y); return b[Math.floor(b.length / 2)]; };
export const rms = (a: number[]): number => Math.sqrt(a.reduce((s, v) => s + v * v, 0) / a.length);
