// Real data: ../shared/data/WL1.sgy, one shot gather from a physical seismic model (sand tank), published as
// benchmark data with Lorenzo, Smolkin, White, Chollett and Sun, "Benchmark hydrogeophysical data from a physical
// seismic model", Computers & Geosciences (repository gllore/lorenzo-benchmarks). Ten traces (27–36) are removed
// and refilled by the network with slopes estimated as the fill pipeline does (core/fill/fill-slopes.ts), then
// scored against the removed traces (core/quality/snr.ts), beside least squares with the same slopes.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openFileByteSource } from '../../../app/host/file-source';
import { solveGapsNetThreads } from '../../../app/host/net-pool';
import { clipWildSlopes, slopeEstimator, slopesForFill } from '../../../core/fill/fill-slopes';
import { solveLeastSquares } from '../../../core/fill/lsq';
import { snrDb } from '../../../core/quality/snr';
import { indexGathers, openSegy, parseGatherKey, readGather } from '../../../core/segy';
import { missingOutside } from '../../support/outside';

const PATH = join(new URL('../../../', import.meta.url).pathname, '../shared/data/WL1.sgy');
const have = existsSync(PATH);
if (!have) {
  const msg = `SKIPPING WL1 network checks: ${PATH} is absent (the open datasets folder ../shared/data/ is not next to this clone).`;
  missingOutside(msg);
}

describe.skipIf(!have)('network fill on WL1.sgy (physical-model shot gather, Lorenzo et al.)', () => {
  it('a block of 10 traces removed: scored against the removed traces, beside least squares', async () => {
    const src = await openFileByteSource(PATH);
    let g;
    try {
      const file = await openSegy(src);
      g = await readGather(file, await indexGathers(file, parseGatherKey('record')), 0);
    } finally {
      await src.close();
    }
    // Layout from ../shared/data/README.md: 64 traces of 780 samples.
    expect([g.nTraces, g.nSamples]).toEqual([64, 780]);
    const nT = g.nTraces, nS = g.nSamples;
    const truth = Float64Array.from(g.data);
    const removed = Array.from({ length: 10 }, (_, i) => 27 + i);
    const unknownTraces = new Uint8Array(nT);
    for (const x of removed) unknownTraces[x] = 1;
    const data = Float64Array.from(truth);
    for (const x of removed) data.fill(0, x * nS, (x + 1) * nS);
    const slopePairs = slopesForFill(data, nT, nS, unknownTraces, slopeEstimator(), 1);
    clipWildSlopes(slopePairs, data, unknownTraces, nT, nS);
    const input = { data, nTraces: nT, nSamples: nS, unknownTraces, slopePairs };
    // Short training (seconds, two threads); the benchmark runs longer.
    const net = await solveGapsNetThreads(input, { width: 24, nFreq: 16, batchData: 192, batchColloc: 192, steps: 150, learningRate: 0.01, seed: 1 }, 2);
    const netSnr = snrDb(truth, net.data, removed, nS);
    const lsqSnr = snrDb(truth, solveLeastSquares(input).data, removed, nS);
    console.log(`WL1, 10 traces removed: network ${netSnr.toFixed(2)} dB (${net.seconds.toFixed(1)} s, ${net.details.windows} windows), least squares ${lsqSnr.toFixed(2)} dB, same estimated slopes`);
    for (let x = 0; x < nT; x++) if (!unknownTraces[x]) for (let t = 0; t < nS; t++) expect(net.data[x * nS + t]).toBe(data[x * nS + t]);
    expect(Number.isFinite(netSnr)).toBe(true);
    // Measured 2026-12-01 (these settings): network −3.9 dB, least squares −10.2 dB (feature spread 0.25: −2.9 dB). Both are below 0 dB (worse than
    // leaving the traces empty): the events on this gather curve and cross within ten traces. The check holds the
    // network to what was measured: better than least squares with the same slopes on this block.
    expect(netSnr).toBeGreaterThan(lsqSnr);
  });
});
