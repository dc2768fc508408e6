// The network fill on worker_threads: same result as in one thread (each window job has its own seed), and
// cancellation reaches busy workers through the shared flag.
import { describe, expect, it } from 'vitest';
import { solveGapsNetThreads } from '../../../../app/host/net-pool';
import { solveGapsNet } from '../../../../core/nn/solver';
import { CancelledError } from '../../../../core/problems';
import { addPlaneWave } from '../../../../core/synth/events';

function input(nTraces: number, nSamples: number) {
  const data = addPlaneWave(new Float64Array(nTraces * nSamples), nTraces, nSamples, { t0Samples: 20, slopeSamplesPerTrace: 0.6, fpCyclesPerSample: 0.06 });
  const unknownTraces = new Uint8Array(nTraces);
  for (let x = 8; x < 14; x++) unknownTraces[x] = 1;
  return { data, nTraces, nSamples, unknownTraces, slopePairs: new Float64Array((nTraces - 1) * nSamples).fill(0.6) };
}

describe('network fill on worker threads', () => {
  it('gives bit-identical results on 2 threads and in this thread', async () => {
    const inp = input(24, 150);
    const o = { width: 16, depth: 1, nFreq: 8, steps: 20, windowSamples: 64, overlapSamples: 16, seed: 9 };
    const a = await solveGapsNetThreads(inp, o, 2);
    const b = await solveGapsNet(inp, o);
    expect(a.details.windows).toBeGreaterThan(2);
    expect(a.data.every((v, i) => Object.is(v, b.data[i]))).toBe(true);
  });

  it('cancels busy workers within one second', async () => {
    const token = { cancelled: false };
    let at = 0;
    const run = solveGapsNetThreads({
      ...input(24, 150), cancel: token,
      onProgress: (p) => {
        if (p.step > 10 && !token.cancelled) {
          token.cancelled = true;
          at = performance.now();
        }
      },
    }, { width: 16, depth: 1, nFreq: 8, steps: 1_000_000, windowSamples: 64, overlapSamples: 16 }, 2);
    await expect(run).rejects.toBeInstanceOf(CancelledError);
    expect(at).toBeGreaterThan(0);
    expect(performance.now() - at).toBeLessThan(1000);
  });
});
