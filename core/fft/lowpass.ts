/**
 * Zero-phase low-pass of every trace along time by FFT. Layout: trace-major (core/grid/gather.ts).
 * Each trace is padded with zeros to a power of two ≥ nSamples + 4/(stop − pass) + 16 (longer than the filter's
 * effective impulse response, so the tail does not wrap around onto the head),
 * multiplied in frequency by a cosine-tapered box: 1 below passCyclesPerSample, 0 above stopCyclesPerSample
 * (cycles per sample; Nyquist is 0.5), and transformed back.
 */
import { createRealFftPlan, nextPowerOfTwo, type RealFftPlan } from './real-fft';

export interface LowpassWorkspace {
  readonly plan: RealFftPlan;
  readonly padded: Float64Array;
  readonly spectrum: Float64Array;
  readonly back: Float64Array;
  /** Gain per bin 0..size/2. */
  readonly gain: Float64Array;
}

export function createLowpassWorkspace(nSamples: number, passCyclesPerSample: number, stopCyclesPerSample: number): LowpassWorkspace {
  if (!(passCyclesPerSample >= 0) || !(stopCyclesPerSample > passCyclesPerSample))
    throw new RangeError(`lowpass: need 0 ≤ pass < stop. Values: ${passCyclesPerSample}, ${stopCyclesPerSample}`);
  const size = nextPowerOfTwo(Math.max(1, nSamples) + Math.ceil(4 / (stopCyclesPerSample - passCyclesPerSample)) + 16);
  const plan = createRealFftPlan(size);
  const gain = new Float64Array(size / 2 + 1);
  for (let b = 0; b <= size / 2; b++) {
    const f = b / size;
    gain[b] = f <= passCyclesPerSample ? 1 : f >= stopCyclesPerSample ? 0
      : 0.5 * (1 + Math.cos((Math.PI * (f - passCyclesPerSample)) / (stopCyclesPerSample - passCyclesPerSample)));
  }
  return { plan, padded: new Float64Array(size), spectrum: new Float64Array(2 * size), back: new Float64Array(size), gain };
}

/**
 * out[trace] = low-pass(x[trace]) for every trace. out may be x itself. Allocation-free given the workspace.
 * @returns out
 */
export function lowpassTracesUnchecked(
  out: Float64Array, x: ArrayLike<number>, nTraces: number, nSamples: number, ws: LowpassWorkspace,
): Float64Array {
  const { plan, padded, spectrum, back, gain } = ws;
  const size = plan.size;
  for (let tr = 0; tr < nTraces; tr++) {
    const base = tr * nSamples;
    let any = false;
    for (let i = 0; i < nSamples; i++) {
      const v = x[base + i];
      padded[i] = v;
      if (v !== 0) any = true;
    }
    if (!any) {
      for (let i = 0; i < nSamples; i++) out[base + i] = 0;
      continue;
    }
    padded.fill(0, nSamples);
    plan.impl.realTransform(spectrum, padded);
    // Only bins 0..size/2 are valid after realTransform; apply the gain there and rebuild the upper half.
    for (let b = 0; b <= size / 2; b++) {
      spectrum[2 * b] *= gain[b];
      spectrum[2 * b + 1] *= gain[b];
    }
    for (let b = 1; b < size / 2; b++) {
      spectrum[2 * (size - b)] = spectrum[2 * b];
      spectrum[2 * (size - b) + 1] = -spectrum[2 * b + 1];
    }
    plan.impl.inverseTransform(plan.scratch, spectrum);
    for (let i = 0; i < nSamples; i++) back[i] = plan.scratch[2 * i];
    for (let i = 0; i < nSamples; i++) out[base + i] = back[i];
  }
  return out;
}

/** Checked, allocating wrapper. */
export function lowpassTraces(x: ArrayLike<number>, nTraces: number, nSamples: number, passCyclesPerSample: number, stopCyclesPerSample: number): Float64Array {
  if (x.length !== nTraces * nSamples) throw new RangeError(`lowpassTraces: length ${x.length} ≠ nTraces*nSamples = ${nTraces * nSamples}`);
  const ws = createLowpassWorkspace(nSamples, passCyclesPerSample, stopCyclesPerSample);
  return lowpassTracesUnchecked(new Float64Array(nTraces * nSamples), x, nTraces, nSamples, ws);
}
