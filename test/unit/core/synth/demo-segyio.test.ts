// The demo files read by an independent SEG-Y library: Debian's python3-segyio (called as /usr/bin/python3).
// segyio must see the same trace count, sample format and interval, the geometry the generator intended
// (records, channels, coordinates with their scalar, offsets, CDPs, trace IDs) and the same samples
// (IBM float, so within IBM's 24-bit hexadecimal fraction: relative 2^-20 at worst).
// Note: python3-segyio 1.8.3 reads bytes 61-64 (water depth at source) as a 2-byte field, against the
// standard's 4 bytes (seen here: it returns 0 where the file holds 4600); that field is checked from the raw bytes instead.
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { DEMO_FILES, demoTraces } from '../../../../core/synth/demo-segy';
import { DEMO_SCENARIO as SC } from '../../../../core/synth/demo-scenario';
import { synthesizeMarineLine } from '../../../../core/synth/marine-shot';

const PY = '/usr/bin/python3';
const probe = spawnSync(PY, ['-c', 'import segyio, numpy'], { encoding: 'utf8' });
const havePy = probe.status === 0;
if (!havePy) {
  const msg = `SKIPPING segyio cross-read of the demo files: ${PY} with segyio is missing. Install Debian's python3-segyio (apt-get install python3-segyio).`;
  missingOutside(msg);
}

const samplesDir = new URL('../../../../samples/', import.meta.url).pathname;
const script = `
import json, sys, segyio, numpy as np
F = segyio.TraceField
out = {}
for path in sys.argv[1:]:
    with segyio.open(path, ignore_geometry=True) as s:
        h = s.header
        keys = [F.FieldRecord, F.TraceNumber, F.offset, F.SourceX, F.SourceY, F.GroupX, F.GroupY, F.CDP, F.CDP_X, F.CDP_Y,
                F.TraceIdentificationCode, F.SourceGroupScalar, F.GroupWaterDepth, F.ElevationScalar, F.TRACE_SAMPLE_COUNT]
        data = s.trace.raw[:]
        out[path] = {
            'tracecount': s.tracecount, 'format': int(s.format), 'interval': int(s.bin[segyio.BinField.Interval]),
            'samples': int(s.bin[segyio.BinField.Samples]), 'sorting': int(s.bin[segyio.BinField.SortingCode]),
            'headers': [[int(h[i][k]) for k in keys] for i in range(s.tracecount)],
            'data': [float(v) for v in data.ravel()],
        }
print(json.dumps(out))
`;
import { missingOutside } from '../../../support/outside';

describe.skipIf(!havePy)('demo files read by python3-segyio', () => {
  const paths = DEMO_FILES.map((f) => join(samplesDir, f.fileName));
  const r = havePy ? spawnSync(PY, ['-c', script, ...paths], { encoding: 'utf8', maxBuffer: 512 * 1024 * 1024 }) : null;
  const read = r && r.status === 0 ? (JSON.parse(r.stdout) as Record<string, { tracecount: number; format: number; interval: number; samples: number; sorting: number; headers: number[][]; data: number[] }>) : {};
  const line = synthesizeMarineLine(SC);

  it.each(DEMO_FILES.map((f) => [f.fileName, f.variant] as const))('%s: headers and samples as generated', (name, variant) => {
    expect(r?.status, r?.stderr).toBe(0);
    const f = read[join(samplesDir, name)];
    const traces = demoTraces(SC, variant);
    expect(f.tracecount).toBe(traces.length);
    expect(f.format).toBe(1); // IBM float
    expect(f.interval).toBe(SC.sampleIntervalUs);
    expect(f.samples).toBe(SC.nSamples);
    let worst = 0;
    traces.forEach((t, i) => {
      const g = line.geometry[t.lineTrace];
      const [record, channel, offset, sx, sy, gx, gy, cdp, cdpX, cdpY, id, scalar, gwd, escalar, ns] = f.headers[i];
      expect([record, channel, cdp, id, scalar, escalar, ns]).toEqual([SC.firstFieldRecord + g.shotIndex, g.channel, g.cdp, t.dead ? 2 : 1, -100, -100, SC.nSamples]);
      expect(Math.abs(offset - g.offsetM)).toBeLessThanOrEqual(0.5);
      for (const [got, want] of [[sx, g.sourceEastingM], [sy, g.sourceNorthingM], [gx, g.groupEastingM], [gy, g.groupNorthingM], [cdpX, g.midpointEastingM], [cdpY, g.midpointNorthingM], [gwd, g.waterDepthAtGroupM]])
        expect(Math.abs(got / 100 - want)).toBeLessThanOrEqual(0.005 + 1e-9);
      for (let s = 0; s < SC.nSamples; s++) {
        const want = t.dead ? 0 : line.data[t.lineTrace * SC.nSamples + s];
        const got = f.data[i * SC.nSamples + s];
        const err = Math.abs(got - want);
        if (err > Math.abs(want) * 2 ** -20 + 1e-30) worst = Math.max(worst, err);
      }
    });
    expect(worst).toBe(0);
  });
});
