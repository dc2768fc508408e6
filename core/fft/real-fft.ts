/**
 * Typed wrapper over fft.js (indutny, CJS, typed `any`): a plan per power-of-two size, real forward and
 * inverse transforms into caller buffers. Spectra are interleaved complex [re0, im0, re1, im1, ...] of
 * length 2·size (full spectrum after the forward transform). Sign convention of fft.js: forward uses
 * e^{−2πikt/n} (as numpy.fft.fft); the inverse divides by n, so a round trip returns the input.
 * A plan holds per-call state: share it within one thread only.
 */
import FFT from 'fft.js';

interface FftJs {
  readonly size: number;
  realTransform(out: Float64Array, data: Float64Array): void;
  completeSpectrum(spectrum: Float64Array): void;
  transform(out: Float64Array, data: Float64Array): void;
  inverseTransform(out: Float64Array, data: Float64Array): void;
}

export interface RealFftPlan {
  readonly size: number;
  /** fft.js instance, typed. */
  readonly impl: FftJs;
  /** Complex scratch for the inverse transform, length 2·size. */
  readonly scratch: Float64Array;
}

export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n > 1 && (n & (n - 1)) === 0;
}

/** Smallest power of two ≥ max(n, 2). */
export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

export function createRealFftPlan(size: number): RealFftPlan {
  if (!isPowerOfTwo(size)) throw new RangeError(`createRealFftPlan: size must be a power of two > 1. Value: ${size}`);
  const impl = new FFT(size) as unknown as FftJs;
  return { size, impl, scratch: new Float64Array(2 * size) };
}

/**
 * Full complex spectrum of a real signal. out: length 2·size; input: length size; they must differ.
 * @returns out
 */
export function realFftForward(plan: RealFftPlan, out: Float64Array, input: Float64Array): Float64Array {
  if (out.length !== 2 * plan.size || input.length !== plan.size)
    throw new RangeError(`realFftForward: need out length ${2 * plan.size} and input length ${plan.size}. Values: ${out.length}, ${input.length}`);
  if ((out.buffer as ArrayBufferLike) === (input.buffer as ArrayBufferLike))
    throw new RangeError('realFftForward: input and output buffers must be different');
  plan.impl.realTransform(out, input);
  plan.impl.completeSpectrum(out);
  return out;
}

/**
 * Real part of the inverse transform of a (Hermitian) spectrum. out: length size; spectrum: length 2·size.
 * The spectrum is not modified. @returns out
 */
export function realFftInverse(plan: RealFftPlan, out: Float64Array, spectrum: Float64Array): Float64Array {
  if (out.length !== plan.size || spectrum.length !== 2 * plan.size)
    throw new RangeError(`realFftInverse: need out length ${plan.size} and spectrum length ${2 * plan.size}. Values: ${out.length}, ${spectrum.length}`);
  const tmp = plan.scratch;
  plan.impl.inverseTransform(tmp, spectrum);
  for (let i = 0; i < plan.size; i++) out[i] = tmp[2 * i];
  return out;
}

/** Complex forward DFT of interleaved data (length 2·size) into out (different buffer). @returns out */
export function complexFftForward(plan: RealFftPlan, out: Float64Array, input: Float64Array): Float64Array {
  if (out.length !== 2 * plan.size || input.length !== 2 * plan.size)
    throw new RangeError(`complexFftForward: need lengths ${2 * plan.size}. Values: ${out.length}, ${input.length}`);
  plan.impl.transform(out, input);
  return out;
}

/** Complex inverse DFT (divided by size) of interleaved data into out (different buffer). @returns out */
export function complexFftInverse(plan: RealFftPlan, out: Float64Array, input: Float64Array): Float64Array {
  if (out.length !== 2 * plan.size || input.length !== 2 * plan.size)
    throw new RangeError(`complexFftInverse: need lengths ${2 * plan.size}. Values: ${out.length}, ${input.length}`);
  plan.impl.inverseTransform(out, input);
  return out;
}
