// The network gap solver end to end on analytic events (core/synth/events.ts: Ricker plane waves with exact
// slopes), scored on the missing traces only (core/quality/snr.ts; methods.md §5).
import { describe, expect, it } from 'vitest';
import { resolveNetOptions, solveGapsNet, netGapSolver, type NetSolverOptions } from '../../../../core/nn/solver';
import { CancelledError, InputFileError } from '../../../../core/problems';
import { snrDb } from '../../../../core/quality/snr';
import { addPlaneWave } from '../../../../core/synth/events';
import type { GapSolverInput } from '../../../../core/fill/solver';

/** A dipping plane wave (σ = 0.8 samples/trace, f_peak 0.05 cycles/sample) with a gap of `gap` traces. */
function planeWaveGap(nTraces: number, nSamples: number, g0: number, gap: number) {
  const truth = addPlaneWave(new Float64Array(nTraces * nSamples), nTraces, nSamples, { t0Samples: 30, slopeSamplesPerTrace: 0.8, fpCyclesPerSample: 0.05 });
  const unknown = new Uint8Array(nTraces);
  for (let x = g0; x < g0 + gap; x++) unknown[x] = 1;
  const data = Float64Array.from(truth);
  for (let x = g0; x < g0 + gap; x++) data.fill(Number.NaN, x * nSamples, (x + 1) * nSamples); // unknown samples may hold anything
  const input: GapSolverInput = { data, nTraces, nSamples, unknownTraces: unknown, slopePairs: new Float64Array((nTraces - 1) * nSamples).fill(0.8) };
  const scored = Array.from({ length: gap }, (_, i) => g0 + i);
  return { truth, input, scored };
}

// Small and fast: one window, 250 steps (a few seconds on a quiet core).
const FAST: NetSolverOptions = { width: 24, depth: 2, nFreq: 16, steps: 250, batchData: 192, batchColloc: 192, learningRate: 0.01, seed: 4 };

describe('network gap solver', () => {
  it('recovers a dipping plane wave across a 16-trace gap to SNR ≥ 20 dB on the missing traces; live traces untouched', async () => {
    const { truth, input, scored } = planeWaveGap(36, 90, 10, 16);
    const r = await solveGapsNet(input, FAST);
    const snr = snrDb(truth, r.data, scored, input.nSamples);
    console.log(`network fill, plane wave, 16-trace gap: SNR ${snr.toFixed(1)} dB in ${r.seconds.toFixed(1)} s`);
    expect(snr).toBeGreaterThanOrEqual(20);
    for (let x = 0; x < input.nTraces; x++) {
      if (input.unknownTraces[x]) continue;
      for (let t = 0; t < input.nSamples; t++) expect(Object.is(r.data[x * input.nSamples + t], input.data[x * input.nSamples + t])).toBe(true);
    }
    expect(r.details.solver).toBe('net');
  });

  it('is deterministic for a fixed seed and changes with the seed', async () => {
    const { input } = planeWaveGap(20, 40, 6, 6);
    const o = { ...FAST, steps: 30 };
    const a = await solveGapsNet(input, o);
    const b = await solveGapsNet(input, o);
    const c = await solveGapsNet(input, { ...o, seed: 5 });
    expect(Array.from(a.data)).toEqual(Array.from(b.data));
    expect(Array.from(a.data)).not.toEqual(Array.from(c.data));
  });

  it('reports progress with loss terms and honours cancel within one second', async () => {
    const { input } = planeWaveGap(36, 300, 10, 16);
    const token = { cancelled: false };
    let calls = 0;
    let cancelledAt = 0;
    const seen: Record<string, number>[] = [];
    const run = solveGapsNet({
      ...input, cancel: token,
      onProgress: (p) => {
        calls++;
        seen.push(p.terms);
        expect(p.totalSteps).toBeGreaterThan(0);
        if (p.step >= 20 && !token.cancelled) {
          token.cancelled = true;
          cancelledAt = performance.now();
        }
      },
    }, { ...FAST, steps: 100_000 });
    await expect(run).rejects.toBeInstanceOf(CancelledError);
    expect(performance.now() - cancelledAt).toBeLessThan(1000);
    expect(calls).toBeGreaterThan(1);
    expect(Object.keys(seen[seen.length - 1])).toEqual(expect.arrayContaining(['data', 'pde', 'lambda']));
  });

  it('stops at the time budget and still returns a fill, flagged as not converged', async () => {
    const { input } = planeWaveGap(36, 90, 10, 16);
    const t = performance.now();
    const r = await solveGapsNet(input, { ...FAST, steps: 100_000, timeBudgetSeconds: 0.5 });
    expect((performance.now() - t) / 1000).toBeLessThan(2);
    expect(r.converged).toBe(false);
    expect(r.details.windowsStoppedByBudget).toBe(1);
    expect(r.data.every((v) => Number.isFinite(v))).toBe(true);
  });

  it('fills gaps at both edges and several runs, each in its own windows, without touching live traces', async () => {
    const { input } = planeWaveGap(30, 40, 0, 3);
    const unknown = new Uint8Array(30);
    for (const x of [0, 1, 2, 10, 11, 20, 28, 29]) unknown[x] = 1;
    const data = Float64Array.from(input.data).map((v) => (Number.isNaN(v) ? 0 : v));
    const r = await solveGapsNet({ ...input, data, unknownTraces: unknown }, { ...FAST, steps: 10 });
    expect(r.details.windows).toBe(4);
    expect(r.data.every((v) => Number.isFinite(v))).toBe(true);
    for (let x = 0; x < 30; x++) {
      const same = r.data.subarray(x * 40, (x + 1) * 40).every((v, t) => v === data[x * 40 + t]);
      if (!unknown[x]) expect(same).toBe(true);
    }
  });

  it('refuses bad settings and bad input with stable codes', async () => {
    const { input } = planeWaveGap(12, 20, 4, 3);
    const code = async (p: Promise<unknown>) => {
      try {
        await p;
        return 'no error';
      } catch (e) {
        return e instanceof InputFileError ? `${e.problem.code}:${e.problem.field}` : String(e);
      }
    };
    expect(await code(solveGapsNet(input, { width: 0 }))).toBe('input.bad-argument:width');
    expect(await code(solveGapsNet(input, { lambda: -1 }))).toBe('input.bad-argument:lambda');
    expect(await code(Promise.resolve(netGapSolver(input, { wdith: 8 })))).toBe('input.bad-argument:wdith');
    const sp = Float64Array.from(input.slopePairs);
    sp[5] = Number.POSITIVE_INFINITY;
    expect(await code(solveGapsNet({ ...input, slopePairs: sp }, FAST))).toBe('input.bad-dips:sample 5');
    expect(await code(solveGapsNet({ ...input, unknownTraces: new Uint8Array(12).fill(1) }, FAST))).toBe('input.bad-argument:unknownTraces');
    expect(resolveNetOptions({ lambda: 'auto' }).lambda).toBe('auto');
  });
});
