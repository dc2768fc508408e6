/**
 * Choice of the fixed Fourier-feature frequencies (Tancik et al. 2020 draw them from a Gaussian; ours are drawn
 * from the data instead). Along t̃ the frequencies follow the mean amplitude spectrum of the live traces in the
 * window, so the features cover the band that is actually there. Along x̃:
 *   'dip'        ω_x = −σ̃·ω_t + jitter, with σ̃ a slope drawn from the window's slope field where the live data
 *                have energy (estimated slopes in quiet parts are poorly constrained): each feature is then
 *                nearly a plane wave that already satisfies u_x̃ + σ̃ u_t̃ = 0 (our design; measured in
 *                docs/network.md against the alternative);
 *   'isotropic'  ω_x Gaussian with the spread implied by the slopes present (closer to plain Fourier features).
 * Units: ω in radians per unit of the scaled coordinate (t̃, x̃ ∈ [−1, 1]).
 */
import { Rng } from '../rng';

export type FeatureMode = 'dip' | 'isotropic';

/**
 * Mean amplitude spectrum over the live traces (direct DFT, once per window: nSamples²·nLive operations).
 * Layout: trace-major (core/grid/gather.ts). @returns out, length floor(nSamples/2)+1, bin k = k/nSamples cycles per sample.
 */
export function meanAmplitudeSpectrum(out: Float64Array, data: Float64Array, known: Uint8Array, nTraces: number, nSamples: number): Float64Array {
  out.fill(0);
  const nBins = out.length;
  const cosT = new Float64Array(nSamples);
  const sinT = new Float64Array(nSamples);
  for (let t = 0; t < nSamples; t++) {
    cosT[t] = Math.cos((2 * Math.PI * t) / nSamples);
    sinT[t] = Math.sin((2 * Math.PI * t) / nSamples);
  }
  for (let x = 0; x < nTraces; x++) {
    if (!known[x]) continue;
    const base = x * nSamples;
    for (let k = 0; k < nBins; k++) {
      let re = 0;
      let im = 0;
      for (let t = 0; t < nSamples; t++) {
        const idx = (k * t) % nSamples;
        re += data[base + t] * cosT[idx];
        im -= data[base + t] * sinT[idx];
      }
      out[k] += Math.hypot(re, im);
    }
  }
  return out;
}

export interface FeatureDraw {
  nFreq: number;
  mode: FeatureMode;
  nTraces: number;
  nSamples: number;
  /** Slopes (samples per trace) to draw from, e.g. the window's pair-grid slope field. */
  slopes: Float64Array;
  /** Drawing weight per slope (e.g. data energy beside it), or null for uniform. */
  slopeWeights: Float64Array | null;
  /** Amplitude spectrum, bin k = k/nSpectrum cycles per sample (nSpectrum = the DFT length). */
  spectrum: Float64Array;
  nSpectrum: number;
  /** Standard deviation of the random part of ω_x, cycles per unit x̃ (both modes). */
  spreadCycles: number;
  seed: number;
}

/** Draws the feature frequencies. @returns { omegaT, omegaX } */
export function drawFeatureFrequencies(d: FeatureDraw): { omegaT: Float64Array; omegaX: Float64Array } {
  const rng = new Rng(d.seed);
  const tScale = (d.nSamples - 1) / 2; // cycles per sample → cycles per unit t̃
  const xScale = (d.nTraces - 1) / 2;
  const slopeToScaled = (d.nTraces - 1) / Math.max(1, d.nSamples - 1);
  const cdf = new Float64Array(d.spectrum.length);
  let acc = 0;
  for (let k = 0; k < d.spectrum.length; k++) cdf[k] = acc += d.spectrum[k];
  const slopeCdf = new Float64Array(d.slopes.length);
  let slopeAcc = 0;
  for (let i = 0; i < d.slopes.length; i++) slopeCdf[i] = slopeAcc += d.slopeWeights ? d.slopeWeights[i] : 1;
  const drawSlope = (): number => {
    const target = rng.uniform() * slopeAcc;
    let lo = 0;
    let hi = slopeCdf.length - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (slopeCdf[mid] < target) lo = mid + 1;
      else hi = mid;
    }
    return d.slopes[lo];
  };
  let rmsSlope = 0;
  for (let i = 0; i < d.slopes.length; i++) rmsSlope += d.slopes[i] * d.slopes[i];
  rmsSlope = d.slopes.length ? Math.sqrt(rmsSlope / d.slopes.length) : 0;
  const omegaT = new Float64Array(d.nFreq);
  const omegaX = new Float64Array(d.nFreq);
  for (let j = 0; j < d.nFreq; j++) {
    // Frequency from the spectrum (inverse CDF, uniform within the bin); flat band if the window is silent.
    let f: number;
    if (acc > 0) {
      const target = rng.uniform() * acc;
      let k = 0;
      while (k < cdf.length - 1 && cdf[k] < target) k++;
      f = (k + rng.uniform() - 0.5) / d.nSpectrum;
    } else {
      f = 0.5 * rng.uniform();
    }
    const wt = 2 * Math.PI * f * tScale * (rng.uniform() < 0.5 ? -1 : 1);
    omegaT[j] = wt;
    if (d.mode === 'dip' && d.slopes.length && slopeAcc > 0) {
      const sig = drawSlope() * slopeToScaled;
      // The random part lets amplitudes vary along x.
      omegaX[j] = -sig * wt + 2 * Math.PI * d.spreadCycles * rng.normal();
    } else {
      omegaX[j] = 2 * Math.PI * (Math.abs(f) * rmsSlope * xScale + d.spreadCycles) * rng.normal();
    }
  }
  return { omegaT, omegaX };
}
