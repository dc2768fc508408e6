import { describe, expect, it } from 'vitest';
import { adamStep, createAdam } from '../../../../core/nn/adam';
import { drawFeatureFrequencies, meanAmplitudeSpectrum } from '../../../../core/nn/features';

describe('Adam', () => {
  // Kingma & Ba 2015, Algorithm 1: after bias correction the first step is m̂/√v̂ = g/|g|, so every parameter
  // moves by exactly the learning rate against its gradient sign (ε aside).
  it('first step moves each parameter by the learning rate against the gradient sign', () => {
    const p = Float64Array.from([1, -2, 3]);
    const st = createAdam(3);
    adamStep(p, Float64Array.from([0.5, -40, 1e-3]), st, 0.01);
    expect(p[0]).toBeCloseTo(0.99, 6);
    expect(p[1]).toBeCloseTo(-1.99, 6);
    expect(p[2]).toBeCloseTo(2.99, 4);
  });

  it('minimises a badly scaled quadratic', () => {
    const p = Float64Array.from([3, -2]);
    const st = createAdam(2);
    const g = new Float64Array(2);
    for (let k = 0; k < 3000; k++) {
      g[0] = 2 * p[0];
      g[1] = 2000 * p[1];
      adamStep(p, g, st, 0.05 * Math.exp(-k / 600));
    }
    expect(Math.abs(p[0])).toBeLessThan(1e-2);
    expect(Math.abs(p[1])).toBeLessThan(1e-2);
  });
});

describe('Fourier-feature frequencies', () => {
  it('follow the spectrum of the live traces and, in dip mode, lie along the given slope', () => {
    const nT = 10, nS = 64, f0 = 8 / 64; // cycles per sample, on a DFT bin
    const data = new Float64Array(nT * nS);
    for (let x = 0; x < nT; x++) for (let t = 0; t < nS; t++) data[x * nS + t] = Math.cos(2 * Math.PI * f0 * (t - 0.7 * x));
    const known = new Uint8Array(nT).fill(1);
    known[4] = 0;
    const spec = meanAmplitudeSpectrum(new Float64Array(nS / 2 + 1), data, known, nT, nS);
    expect(spec.indexOf(Math.max(...spec))).toBe(8);
    const slopes = new Float64Array((nT - 1) * nS).fill(0.7);
    const { omegaT, omegaX } = drawFeatureFrequencies({ nFreq: 50, mode: 'dip', nTraces: nT, nSamples: nS, slopes, slopeWeights: null, spectrum: spec, nSpectrum: nS, spreadCycles: 0.25, seed: 3 });
    const tScale = (nS - 1) / 2;
    const sigmaScaled = 0.7 * (nT - 1) / (nS - 1);
    for (let j = 0; j < 50; j++) {
      // Within half a bin of f0 (uniform jitter inside the drawn bin).
      expect(Math.abs(Math.abs(omegaT[j]) / (2 * Math.PI * tScale) - f0)).toBeLessThanOrEqual(0.5 / nS + 1e-12);
    }
    // ω_x = −σ̃ ω_t + jitter of standard deviation 2π·0.25 rad per unit x̃: mean |deviation| ≈ 0.8·π/2 ≈ 1.25;
    // isotropic features ignore the slope and deviate far more.
    const iso = drawFeatureFrequencies({ nFreq: 50, mode: 'isotropic', nTraces: nT, nSamples: nS, slopes, slopeWeights: null, spectrum: spec, nSpectrum: nS, spreadCycles: 0.25, seed: 3 });
    let dev = 0, devIso = 0;
    for (let j = 0; j < 50; j++) {
      dev += Math.abs(omegaX[j] + sigmaScaled * omegaT[j]) / 50;
      devIso += Math.abs(iso.omegaX[j] + sigmaScaled * iso.omegaT[j]) / 50;
    }
    expect(dev).toBeGreaterThan(0.7);
    expect(dev).toBeLessThan(1.8);
    expect(devIso).toBeGreaterThan(2 * dev);
  });
});
