import { describe, expect, it } from 'vitest';
import { followCharacteristic, paintBlock, sampleAt } from '../../../../core/fill/paint';
import { addPlaneWave, ricker } from '../../../../core/synth/events';
import { snrDb } from '../../../../core/quality/snr';

describe('two-sided painting (starting guess)', () => {
  it('interpolates a band-limited trace between samples (Ricker, analytic)', () => {
    const nS = 200;
    const u = new Float64Array(nS).map((_, t) => ricker(t - 100, 0.1));
    for (const tau of [50.25, 99.5, 100.3, 140.77]) expect(Math.abs(sampleAt(u, 0, nS, tau) - ricker(tau - 100, 0.1))).toBeLessThan(6e-4);
    expect(sampleAt(u, 0, nS, 73)).toBe(u[73]);
    expect(sampleAt(u, 0, nS, -5)).toBe(0);
    // τ a hair below an integer: the fraction rounds to 1 in floating point (found by the benchmark).
    for (const tau of [-1e-17, 99 - 1e-15, 100 - 2 ** -45]) expect(Number.isFinite(sampleAt(u, 0, nS, tau))).toBe(true);
  });

  it('follows a constant slope exactly', () => {
    const nS = 100, nT = 6;
    const s = new Float64Array((nT - 1) * nS).fill(0.7);
    expect(followCharacteristic(s, nS, 0, 5, 20)).toBeCloseTo(23.5, 12);
    expect(followCharacteristic(s, nS, 5, 0, 23.5)).toBeCloseTo(20, 12);
  });

  it('paints a plane wave across a 12-trace gap to better than 35 dB without any iteration', () => {
    const nT = 30, nS = 300;
    const u = addPlaneWave(new Float64Array(nT * nS), nT, nS, { t0Samples: 60, slopeSamplesPerTrace: 1.3, fpCyclesPerSample: 0.08 });
    const d = u.slice();
    d.fill(0, 9 * nS, 21 * nS);
    paintBlock(d, nT, nS, new Float64Array((nT - 1) * nS).fill(1.3), 9, 20);
    const hidden = Array.from({ length: 12 }, (_, i) => 9 + i);
    expect(snrDb(u, d, hidden, nS)).toBeGreaterThan(35);
  });
});
