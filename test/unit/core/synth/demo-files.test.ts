// The committed demo files (samples/*.sgy) against a fresh in-memory run of the generator (byte for byte),
// and their headers against the geometry they claim: SEG-Y rev 1 byte positions (core/segy/fields.ts, from
// the standard via methods.md §6.8) and plain surveying arithmetic (common practice, no source).
import { describe, expect, it } from 'vitest';
import { readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { buildDemoFiles, DEMO_DEFAULT_FILE, DEMO_FILES, demoTraces } from '../../../../core/synth/demo-segy';
import { DEMO_SCENARIO as SC } from '../../../../core/synth/demo-scenario';
import { obstructedChannels, receiverAlongM, traceGeometry } from '../../../../core/synth/marine-geometry';
import { TRACE_HEADER, type TraceFieldName } from '../../../../core/segy/fields';
import { memoryByteSource, openSegy, indexGathers, parseGatherKey, readGather, gatherGeometry } from '../../../../core/segy';

const samplesDir = new URL('../../../../samples/', import.meta.url).pathname;
const built = buildDemoFiles();

function field(bytes: Uint8Array, trace: number, name: TraceFieldName): number {
  const nSamples = SC.nSamples;
  const at = 3600 + trace * (240 + 4 * nSamples) + TRACE_HEADER[name].byte - 1;
  const v = new DataView(bytes.buffer, bytes.byteOffset);
  return TRACE_HEADER[name].kind === 'i32' ? v.getInt32(at, false) : v.getInt16(at, false);
}

describe('committed demo files', () => {
  it.each(DEMO_FILES.map((f) => f.fileName))('%s is byte-identical to a fresh run of the generator', (name) => {
    const path = join(samplesDir, name);
    expect(existsSync(path), `${path} is missing: run npm run samples`).toBe(true);
    const committed = new Uint8Array(readFileSync(path));
    const fresh = built.find((b) => b.spec.fileName === name)!.bytes;
    expect(committed.length).toBe(fresh.length);
    let firstDiff = -1;
    for (let i = 0; i < fresh.length; i++) if (committed[i] !== fresh[i]) { firstDiff = i; break; }
    expect(firstDiff, `first differing byte offset (regenerate with npm run samples if the generator changed on purpose)`).toBe(-1);
  });

  it('the default file is one of them', () => {
    expect(DEMO_FILES.map((f) => f.fileName)).toContain(DEMO_DEFAULT_FILE);
  });

  it('stay small enough to commit (under 3 MB each)', () => {
    for (const b of built) expect(b.bytes.length).toBeLessThan(3_000_000);
  });
});

describe('headers describe a consistent towed-streamer geometry', () => {
  const full = built.find((b) => b.spec.variant === 'full')!.bytes;
  const nTraces = SC.nShots * SC.nChannels;

  it('offset = source-group distance, CDP X/Y = midpoint, groups 12.5 m apart, shots 50 m apart', () => {
    for (let i = 0; i < nTraces; i++) {
      const sx = field(full, i, 'SOURCE_X') / 100, sy = field(full, i, 'SOURCE_Y') / 100;
      const gx = field(full, i, 'RECEIVER_X') / 100, gy = field(full, i, 'RECEIVER_Y') / 100;
      const dist = Math.hypot(sx - gx, sy - gy);
      expect(Math.abs(field(full, i, 'OFFSET') - dist)).toBeLessThanOrEqual(0.5 + 0.02); // whole metres
      expect(Math.abs(field(full, i, 'ENSEMBLE_X') / 100 - (sx + gx) / 2)).toBeLessThanOrEqual(0.011);
      expect(Math.abs(field(full, i, 'ENSEMBLE_Y') / 100 - (sy + gy) / 2)).toBeLessThanOrEqual(0.011);
      expect(field(full, i, 'COORDINATE_SCALAR')).toBe(-100);
      // Water depths (bytes 61-64 and 65-68, elevation scalar −100 at 69-70) as the seabed model says.
      const g = traceGeometry(SC, Math.floor(i / SC.nChannels), (i % SC.nChannels) + 1);
      expect(field(full, i, 'ELEVATION_SCALAR')).toBe(-100);
      expect(Math.abs(field(full, i, 'SOURCE_WATER_DEPTH') / 100 - g.waterDepthAtSourceM)).toBeLessThanOrEqual(0.005 + 1e-9);
      expect(Math.abs(field(full, i, 'RECEIVER_WATER_DEPTH') / 100 - g.waterDepthAtGroupM)).toBeLessThanOrEqual(0.005 + 1e-9);
      expect(field(full, i, 'TRACE_ID_CODE')).toBe(1);
      expect(field(full, i, 'SAMPLES_IN_TRACE')).toBe(SC.nSamples);
      expect(field(full, i, 'SAMPLE_INTERVAL_US')).toBe(SC.sampleIntervalUs);
      expect(field(full, i, 'TRACE_SEQUENCE_IN_FILE')).toBe(i + 1);
      if (i % SC.nChannels > 0) {
        const px = field(full, i - 1, 'RECEIVER_X') / 100, py = field(full, i - 1, 'RECEIVER_Y') / 100;
        expect(Math.abs(Math.hypot(gx - px, gy - py) - SC.groupIntervalM)).toBeLessThan(0.02);
        expect(field(full, i, 'TRACE_IN_FIELD_RECORD')).toBe(field(full, i - 1, 'TRACE_IN_FIELD_RECORD') + 1);
        // CDP bins are half a group interval: one channel further is one CDP less.
        expect(field(full, i, 'ENSEMBLE')).toBe(field(full, i - 1, 'ENSEMBLE') - 1);
      }
      if (i >= SC.nChannels) {
        const qx = field(full, i - SC.nChannels, 'SOURCE_X') / 100, qy = field(full, i - SC.nChannels, 'SOURCE_Y') / 100;
        expect(Math.abs(Math.hypot(sx - qx, sy - qy) - SC.shotIntervalM)).toBeLessThan(0.02);
        expect(field(full, i, 'FIELD_RECORD')).toBe(field(full, i - SC.nChannels, 'FIELD_RECORD') + 1);
      }
    }
  });

  it('a CDP gets one trace per shot that covers it (trace-in-ensemble counts 1, 2, …)', () => {
    const seen = new Map<number, number[]>();
    for (let i = 0; i < nTraces; i++) {
      const c = field(full, i, 'ENSEMBLE');
      seen.set(c, [...(seen.get(c) ?? []), field(full, i, 'TRACE_IN_ENSEMBLE')]);
    }
    for (const list of seen.values()) expect(list).toEqual(list.map((_, k) => k + 1));
    // Full fold in the middle of the line: channels · group interval / (2 · shot interval), capped by the shot count.
    expect(Math.max(...[...seen.values()].map((l) => l.length))).toBe(Math.min(SC.nShots, (SC.nChannels * SC.groupIntervalM) / (2 * SC.shotIntervalM)));
  });

  it('the gap file lacks exactly the groups within the obstruction zone, 12-20 per shot, at channels that move with the vessel', () => {
    const gap = demoTraces(SC, 'gap');
    const kept = new Set(gap.map((t) => t.lineTrace));
    let previousFirst = -1;
    for (let shot = 0; shot < SC.nShots; shot++) {
      const absent = obstructedChannels(SC, shot);
      expect(absent.length).toBeGreaterThanOrEqual(12);
      expect(absent.length).toBeLessThanOrEqual(20);
      expect(absent[0]).toBeGreaterThan(previousFirst);
      previousFirst = absent[0];
      for (let c = 1; c <= SC.nChannels; c++) {
        const inZone = Math.abs(receiverAlongM(SC, shot, c) - SC.obstructionAlongLineM) < SC.obstructionHalfWidthM;
        expect(kept.has(shot * SC.nChannels + c - 1)).toBe(!inZone);
      }
    }
  });
});

describe('the reader sees the intended gathers', () => {
  async function gathers(name: string) {
    const bytes = built.find((b) => b.spec.fileName === name)!.bytes;
    const file = await openSegy(memoryByteSource(name, bytes));
    const index = await indexGathers(file, parseGatherKey('record'));
    const out = [];
    for (let i = 0; i < index.gathers.length; i++) {
      const g = await readGather(file, index, i);
      out.push({ key: index.gathers[i].keyValue, geometry: gatherGeometry(g.headers, g.data, g.nSamples) });
    }
    return { file, out };
  }

  it('gap file: 5 shot gathers on a 12.5 m grid of 144 positions, 16 missing each, 2 dead in record 3103', async () => {
    const { file, out } = await gathers('grv07-gap.sgy');
    expect(file.formatCode).toBe(1);
    expect(file.revision).toBe(1);
    expect(out.map((g) => g.key)).toEqual([3101, 3102, 3103, 3104, 3105]);
    for (const [k, g] of out.entries()) {
      expect(g.geometry.positionSource).toBe('receiver');
      expect(g.geometry.spacingM).toBeCloseTo(12.5, 3);
      expect(g.geometry.gridCount).toBe(144);
      expect(Array.from(g.geometry.missingGrid)).toEqual(obstructedChannels(SC, k).map((c) => c - 1));
      expect(Array.from(g.geometry.deadGrid)).toEqual(k === SC.deadShotIndex ? SC.deadChannels.map((c) => c - 1) : []);
    }
  });

  it('decimated file: 72 traces per shot on a 25 m grid, nothing missing', async () => {
    const { out } = await gathers('grv07-decimated.sgy');
    for (const g of out) {
      expect(g.geometry.spacingM).toBeCloseTo(25, 3);
      expect(g.geometry.gridCount).toBe(72);
      expect(g.geometry.missingGrid.length).toBe(0);
    }
  });
});
