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
  /** Packed complex input (two traces), length 2·size. */
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
  return { plan, padded: new Float64Array(2 * size), spectrum: new Float64Array(2 * size), back: new Float64Array(size), gain };
}

/**
 * out[trace] = low-pass(x[trace]) for every trace. out may be x itself. Allocation-free given the workspace.
 * Two traces go through one complex transform (trace a as the real part, trace b as the imaginary part): the gain
 * is real and even in frequency, so filtering a + ib gives filtered a + i·filtered b (common FFT practice).
 * @returns out
 */
export function lowpassTracesUnchecked(
  out: Float64Array, x: ArrayLike<number>, nTraces: number, nSamples: number, ws: LowpassWorkspace,
): Float64Array {
  const { plan, spectrum, gain } = ws;
  const size = plan.size;
  const packed = ws.padded;
  const back = plan.scratch;
  for (let a = 0; a < nTraces; a += 2) {
    const b = a + 1 < nTraces ? a + 1 : -1;
    const baseA = a * nSamples, baseB = b * nSamples;
    packed.fill(0);
    let any = false;
    for (let i = 0; i < nSamples; i++) {
      const va = x[baseA + i];
      packed[2 * i] = va;
      if (va !== 0) any = true;
      if (b >= 0) {
        const vb = x[baseB + i];
        packed[2 * i + 1] = vb;
        if (vb !== 0) any = true;
      }
    }
    if (!any) {
      for (let i = 0; i < nSamples; i++) out[baseA + i] = 0;
      if (b >= 0) for (let i = 0; i < nSamples; i++) out[baseB + i] = 0;
      continue;
    }
    plan.impl.transform(spectrum, packed);
    for (let k = 0; k < size; k++) {
      const g = gain[k <= size / 2 ? k : size - k];
      spectrum[2 * k] *= g;
      spectrum[2 * k + 1] *= g;
    }
    plan.impl.inverseTransform(back, spectrum);
    for (let i = 0; i < nSamples; i++) out[baseA + i] = back[2 * i];
    if (b >= 0) for (let i = 0; i < nSamples; i++) out[baseB + i] = back[2 * i + 1];
  }
  return out;
}

/** Checked, allocating wrapper. */
export function lowpassTraces(x: ArrayLike<number>, nTraces: number, nSamples: number, passCyclesPerSample: number, stopCyclesPerSample: number): Float64Array {
  if (x.length !== nTraces * nSamples) throw new RangeError(`lowpassTraces: length ${x.length} ≠ nTraces*nSamples = ${nTraces * nSamples}`);
  const ws = createLowpassWorkspace(nSamples, passCyclesPerSample, stopCyclesPerSample);
  return lowpassTracesUnchecked(new Float64Array(nTraces * nSamples), x, nTraces, nSamples, ws);
}
