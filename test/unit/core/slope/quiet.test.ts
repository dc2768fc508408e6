/**
 * Where the data say nothing the slope must stay bounded and settle to a sensible background, and the confidence
 * must say so (docs/slopes.md "Quiet and incoherent zones"). Old behaviour these checks catch (measured before
 * the fix, 2026-12-01): pure Gaussian noise planned 4 coarse-to-fine levels from a "steepest slope" of 18 samples
 * per trace read off the noise, and returned slopes up to 34 samples per trace.
 * Expectations are facts of the method, not figures from an outside program: noise has no slope (common
 * practice, no source); a plane wave's slope is exact by construction (core/synth/events.ts).
 */
import { describe, expect, it } from 'vitest';
import { Rng } from '../../../../core/rng';
import { estimateSlopes } from '../../../../core/slope/estimate';
import { planeWaveGather } from './helpers';

const maxAbs = (a: Float64Array) => a.reduce((m, v) => Math.max(m, Math.abs(v)), 0);

describe('slopes where the data say nothing', () => {
  it('pure noise: no coarse-to-fine levels, every |σ| within the minimum bound of 3, low confidence', () => {
    const nT = 120, nS = 600;
    const rng = new Rng(3);
    const u = new Float64Array(nT * nS).map(() => rng.normal());
    const f = estimateSlopes(u, nT, nS, new Uint8Array(nT).fill(1));
    expect(f.info.maxSlopeSamplesPerTrace).toBeLessThan(1);
    expect(f.info.timeLevels).toBe(0);
    expect(maxAbs(f.slopePairs)).toBeLessThanOrEqual(3);
    const meanConf = f.confidencePairs.reduce((a, b) => a + b, 0) / f.confidencePairs.length;
    expect(meanConf).toBeLessThan(0.3); // measured 0.20
  });

  it('a 60-sample stretch of zero amplitude inside a plane wave keeps the plane wave slope, with zero confidence (longer silences fade to flat)', () => {
    const nT = 60, nS = 400, slope = 1.2;
    const u = planeWaveGather(nT, nS, slope, 0.08);
    for (let x = 0; x < nT; x++) u.fill(0, x * nS + 170, x * nS + 230);
    const f = estimateSlopes(u, nT, nS, new Uint8Array(nT).fill(1));
    let worst = 0, conf = 0, n = 0;
    for (let p = 5; p < nT - 6; p++) for (let t = 180; t < 220; t++) {
      worst = Math.max(worst, Math.abs(f.slopePairs[p * nS + t] - slope));
      conf += f.confidencePairs[p * nS + t];
      n++;
    }
    expect(conf / n).toBeLessThan(0.05);
    expect(worst).toBeLessThan(0.5);
  });

  it('a quiet lower half (noise 60 dB down) does not set the steepest slope and stays within the events\' range', () => {
    const nT = 120, nS = 600, slope = 0.8;
    const u = planeWaveGather(nT, nS, slope, 0.08);
    const rng = new Rng(5);
    for (let x = 0; x < nT; x++) for (let t = 0; t < nS; t++) {
      if (t >= 300) u[x * nS + t] = 1e-3 * rng.normal();
    }
    const f = estimateSlopes(u, nT, nS, new Uint8Array(nT).fill(1));
    expect(f.info.maxSlopeSamplesPerTrace).toBeLessThan(1.5 * slope);
    expect(f.info.timeLevels).toBe(0);
    let worst = 0;
    for (let p = 0; p < nT - 1; p++) for (let t = 320; t < nS; t++) worst = Math.max(worst, Math.abs(f.slopePairs[p * nS + t]));
    expect(worst).toBeLessThanOrEqual(3);
    // The recorded upper half keeps its accuracy (median error, away from the edges and the quiet boundary).
    const err: number[] = [];
    for (let p = 5; p < nT - 6; p++) for (let t = 20; t < 260; t++) err.push(Math.abs(f.slopePairs[p * nS + t] - slope));
    err.sort((a, b) => a - b);
    expect(err[err.length >> 1]).toBeLessThan(0.05);
  });
});
