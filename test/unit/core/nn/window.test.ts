import { describe, expect, it } from 'vitest';
import { blendNetWindows, missingRuns, planNetWindows, timeWindowStarts, type NetWindowFill } from '../../../../core/nn/window';
import { Rng } from '../../../../core/rng';

describe('network windows', () => {
  it('finds runs of missing traces, including at the edges', () => {
    expect(missingRuns(Uint8Array.from([1, 1, 0, 0, 1, 0, 1]))).toEqual([[0, 2], [4, 5], [6, 7]]);
    expect(missingRuns(new Uint8Array(5))).toEqual([]);
  });

  it('time windows cover the trace with at least the requested overlap', () => {
    for (const [n, w, ov] of [[600, 160, 32], [161, 160, 32], [1000, 128, 40], [100, 160, 32]]) {
      const s = timeWindowStarts(n, Math.min(n, w), ov);
      expect(s[0]).toBe(0);
      expect(s[s.length - 1] + Math.min(n, w)).toBe(n);
      for (let k = 1; k < s.length; k++) expect(s[k - 1] + w - s[k]).toBeGreaterThanOrEqual(ov);
    }
  });

  it('plans one job per run × time window, copies live traces and slopes, and never exposes unknown samples', () => {
    const nT = 30, nS = 50;
    const rng = new Rng(1);
    const data = new Float64Array(nT * nS).map(() => rng.normal());
    const slopes = new Float64Array((nT - 1) * nS).map(() => rng.normal());
    const unknown = new Uint8Array(nT);
    for (const x of [3, 4, 20, 21, 22]) unknown[x] = 1;
    const jobs = planNetWindows(data, nT, nS, unknown, slopes, { marginTraces: 5, windowSamples: 30, overlapSamples: 10, seed: 3 });
    expect(jobs.length).toBe(2 * 2);
    const j = jobs[2];
    expect([j.traceStart, j.nTraces, j.fillStart, j.fillEnd]).toEqual([15, 13, 5, 8]);
    for (let x = 0; x < j.nTraces; x++) {
      for (let t = 0; t < j.nSamples; t++) {
        const g = data[(j.traceStart + x) * nS + j.sampleStart + t];
        expect(j.data[x * j.nSamples + t]).toBe(j.known[x] ? g : 0);
        if (x < j.nTraces - 1) expect(j.slopePairs[x * j.nSamples + t]).toBe(slopes[(j.traceStart + x) * nS + j.sampleStart + t]);
      }
    }
    expect(new Set(jobs.map((q) => q.seed)).size).toBe(jobs.length);
  });

  it('blending: tapers sum to one (a constant fill comes back exactly) and live traces are not written', () => {
    const nT = 12, nS = 200;
    const unknown = new Uint8Array(nT);
    for (let x = 4; x < 8; x++) unknown[x] = 1;
    const data = new Float64Array(nT * nS).fill(7);
    const jobs = planNetWindows(data, nT, nS, unknown, new Float64Array((nT - 1) * nS), { marginTraces: 3, windowSamples: 64, overlapSamples: 24, seed: 1 });
    expect(jobs.length).toBeGreaterThan(3);
    const fills: NetWindowFill[] = jobs.map((j) => ({ index: j.index, fill: new Float64Array((j.fillEnd - j.fillStart) * j.nSamples).fill(2.5), steps: 0, seconds: 0, terms: {} }));
    const out = Float64Array.from(data);
    blendNetWindows(out, nS, jobs, fills, 24);
    for (let x = 0; x < nT; x++) for (let t = 0; t < nS; t++) expect(out[x * nS + t]).toBeCloseTo(unknown[x] ? 2.5 : 7, 13);
  });
});
