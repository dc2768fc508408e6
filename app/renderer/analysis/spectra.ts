/**
 * Amplitude spectra and f-k spectra for the check step. Pure numerics over core/fft (fft.js wrapper).
 * Layout: trace-major data[trace * nSamples + sample] (core/grid/gather.ts).
 *
 * f-k practice (methods.md §5; Gan et al. 2015 use spectra this way): Hann tapers in time and across traces,
 * zero padding to a power of two, log amplitude. Regular decimation by R with zero traces creates replicas
 * of every event shifted by 1/(R·Δx) in wavenumber; a good fill removes them.
 */
import { createRealFftPlan, complexFftForward, nextPowerOfTwo, realFftForward } from '../../../core/fft/real-fft';

export interface AmplitudeSpectrum {
  readonly frequencyHz: Float64Array;
  /** Mean amplitude over the traces, in dB relative to the largest value of `reference` (or of itself). */
  readonly db: Float64Array;
  readonly peak: number;
}

function hann(n: number): Float64Array {
  const w = new Float64Array(n);
  if (n === 1) w[0] = 1;
  else for (let i = 0; i < n; i++) w[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1));
  return w;
}

/** Mean amplitude spectrum of the listed traces (one-sided, 0..Nyquist), not yet in dB. */
export function meanAmplitude(data: ArrayLike<number>, nSamples: number, traces: readonly number[], dtSeconds: number): { frequencyHz: Float64Array; amplitude: Float64Array } {
  const size = nextPowerOfTwo(nSamples);
  const plan = createRealFftPlan(size);
  const input = new Float64Array(size);
  const out = new Float64Array(2 * size);
  const nF = size / 2 + 1;
  const amp = new Float64Array(nF);
  const w = hann(nSamples);
  for (const x of traces) {
    input.fill(0);
    for (let t = 0; t < nSamples; t++) input[t] = data[x * nSamples + t] * w[t];
    realFftForward(plan, out, input);
    for (let f = 0; f < nF; f++) amp[f] += Math.hypot(out[2 * f], out[2 * f + 1]);
  }
  if (traces.length) for (let f = 0; f < nF; f++) amp[f] /= traces.length;
  const frequencyHz = new Float64Array(nF);
  for (let f = 0; f < nF; f++) frequencyHz[f] = f / (size * dtSeconds);
  return { frequencyHz, amplitude: amp };
}

/** Converts amplitudes to dB relative to `ref` (floor −120 dB). */
export function toDb(amplitude: Float64Array, ref: number): Float64Array {
  const out = new Float64Array(amplitude.length);
  for (let i = 0; i < amplitude.length; i++) out[i] = ref > 0 && amplitude[i] > 0 ? Math.max(-120, 20 * Math.log10(amplitude[i] / ref)) : -120;
  return out;
}

export interface FkSpectrum {
  /** Wavenumbers, centred (negative to positive), cycles per metre (or per trace when spacing is unknown). */
  readonly wavenumber: Float64Array;
  /** 0..Nyquist in Hz. */
  readonly frequencyHz: Float64Array;
  /** Amplitude, wavenumber-major: amp[k * nF + f]. */
  readonly amplitude: Float64Array;
  readonly nK: number;
  readonly nF: number;
  readonly wavenumberUnit: 'cycles/m' | 'cycles/trace';
}

/**
 * 2-D amplitude spectrum |U(f, k)| of a gather on its regular grid (missing traces as zeros, as they are
 * in the data handed to the fill). Tapers: Hann in time and across traces.
 */
export function fkSpectrum(data: ArrayLike<number>, nTraces: number, nSamples: number, dtSeconds: number, spacingM: number | null): FkSpectrum {
  const nT = nextPowerOfTwo(nSamples);
  const nX = nextPowerOfTwo(nTraces);
  const nF = nT / 2 + 1;
  const planT = createRealFftPlan(nT);
  const planX = createRealFftPlan(nX);
  const wt = hann(nSamples);
  const wx = hann(nTraces);
  // Time transforms first: one-sided spectra per trace, complex, trace-major spec[x][f].
  const spec = new Float64Array(nX * nF * 2);
  const input = new Float64Array(nT);
  const out = new Float64Array(2 * nT);
  for (let x = 0; x < nTraces; x++) {
    input.fill(0);
    for (let t = 0; t < nSamples; t++) input[t] = data[x * nSamples + t] * wt[t] * wx[x];
    realFftForward(planT, out, input);
    spec.set(out.subarray(0, 2 * nF), x * nF * 2);
  }
  // Then across traces for each frequency; fftshift the wavenumber axis.
  const col = new Float64Array(2 * nX);
  const colOut = new Float64Array(2 * nX);
  const amplitude = new Float64Array(nX * nF);
  for (let f = 0; f < nF; f++) {
    for (let x = 0; x < nX; x++) {
      col[2 * x] = spec[(x * nF + f) * 2];
      col[2 * x + 1] = spec[(x * nF + f) * 2 + 1];
    }
    complexFftForward(planX, colOut, col);
    for (let k = 0; k < nX; k++) {
      const shifted = (k + nX / 2) % nX;
      amplitude[shifted * nF + f] = Math.hypot(colOut[2 * k], colOut[2 * k + 1]);
    }
  }
  const dx = spacingM && spacingM > 0 ? spacingM : 1;
  const wavenumber = new Float64Array(nX);
  for (let i = 0; i < nX; i++) wavenumber[i] = (i - nX / 2) / (nX * dx);
  const frequencyHz = new Float64Array(nF);
  for (let f = 0; f < nF; f++) frequencyHz[f] = f / (nT * dtSeconds);
  return { wavenumber, frequencyHz, amplitude, nK: nX, nF, wavenumberUnit: spacingM && spacingM > 0 ? 'cycles/m' : 'cycles/trace' };
}

/**
 * Share of f-k energy away from the main event band: energy at |k| above `kCut` (e.g. half the live
 * wavenumber Nyquist) over the total. Replicas from decimation raise it; a good fill lowers it.
 */
export function energyBeyondWavenumber(fk: FkSpectrum, kCut: number): number {
  let all = 0;
  let beyond = 0;
  for (let k = 0; k < fk.nK; k++) {
    const far = Math.abs(fk.wavenumber[k]) > kCut;
    for (let f = 0; f < fk.nF; f++) {
      const e = fk.amplitude[k * fk.nF + f] ** 2;
      all += e;
      if (far) beyond += e;
    }
  }
  return all > 0 ? beyond / all : 0;
}
