// Real data: ../shared/data/WL1.sgy, one shot gather from a physical seismic model (sand tank), published as
// benchmark data with Lorenzo, Smolkin, White, Chollett and Sun, "Benchmark hydrogeophysical data from a physical
// seismic model", Computers & Geosciences (repository gllore/lorenzo-benchmarks). Traces are removed, refilled
// with the default settings (estimated slopes, least squares), and the SNR on the removed traces is compared with
// the hold-out score the fill reports (issue 4: it should predict that SNR within 3 dB).
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openFileByteSource } from '../../../app/host/file-source';
import { fillGather } from '../../../core/fill/pipeline';
import { planFill } from '../../../core/fill/plan';
import { snrDb } from '../../../core/quality/snr';
import { indexGathers, openSegy, parseGatherKey, readGather } from '../../../core/segy';
import { missingOutside } from '../../support/outside';

const PATH = join(new URL('../../../', import.meta.url).pathname, '../shared/data/WL1.sgy');
const have = existsSync(PATH);
if (!have) {
  const msg = `SKIPPING WL1 fill checks: ${PATH} is absent (the open datasets folder ../shared/data/ is not next to this clone).`;
  missingOutside(msg);
}

async function loadWl1() {
  const src = await openFileByteSource(PATH);
  try {
    const file = await openSegy(src);
    const index = await indexGathers(file, parseGatherKey('record'));
    return await readGather(file, index, 0);
  } finally {
    await src.close();
  }
}

async function refill(nTraces: number, removed: number[]) {
  const g = await loadWl1();
  const nS = g.nSamples;
  const truth = g.data.slice(0, nTraces * nS);
  const data = truth.slice();
  for (const x of removed) data.fill(0, x * nS, (x + 1) * nS);
  const present = Array.from({ length: nTraces }, (_, x) => (removed.includes(x) ? 0 : 1));
  const r = await fillGather({ data, nTraces, nSamples: nS, plan: planFill({ nTraces, present }) });
  const trueSnr = snrDb(truth, r.filled, removed, nS);
  console.log(`WL1 ${removed.length} removed: SNR on removed traces ${trueSnr.toFixed(2)} dB, hold-out ${r.holdoutSnrDb.toFixed(2)} dB (${r.holdoutKind}), slopes ${r.details.slopeChoice}, gap RMS ratio ${r.gapRmsRatio.toFixed(2)}`);
  return { trueSnr, r };
}

describe.skipIf(!have)('fill on WL1.sgy (physical-model shot gather, Lorenzo et al.)', () => {
  // Every second trace removed from traces 0..62 (so the gather ends on a recorded trace).
  // Measured 2026-12-01 21:30 UTC: SNR −1.13 dB, hold-out +0.41 dB (difference 1.5 dB).
  it('every second trace removed: the hold-out score predicts the SNR on the removed traces within 3 dB', async () => {
    const removed = Array.from({ length: 31 }, (_, i) => 2 * i + 1);
    const { trueSnr, r } = await refill(63, removed);
    expect(r.holdoutKind).toBe('decimation');
    expect(r.holdoutTraces.every((h) => !removed.includes(h))).toBe(true);
    expect(Math.abs(r.holdoutSnrDb - trueSnr)).toBeLessThanOrEqual(3);
  });

  // A centred block of 10 traces (27–36). Known shortfall, reported to the lead and in docs/fill.md. Measured
  // 2026-12-01 21:30 UTC: SNR −4.63 dB, hold-out −0.55 dB (difference 4.1 dB > 3; the hold-out block sits at 9–18).
  // Every fill here scores below ~0 dB (worse than or equal to no fill), and the hold-out says the fill is not to
  // be trusted; the removed block holds trace 34, one of the loud traces that recur every 8 channels in this
  // gather (RMS 55 against 6–9 beside it), which dominates the error. Other 10-trace blocks (10–19, 44–53)
  // measured within 1.2 dB. The check stays at 3 dB and is marked failing, so it turns red the day it holds.
  it.fails('a block of 10 traces removed: the hold-out score predicts the SNR within 3 dB (known to fail, see docs/fill.md)', async () => {
    const removed = Array.from({ length: 10 }, (_, i) => 27 + i);
    const { trueSnr, r } = await refill(64, removed);
    expect(r.holdoutKind).toBe('block');
    expect(Math.abs(r.holdoutSnrDb - trueSnr)).toBeLessThanOrEqual(3);
  });
});
