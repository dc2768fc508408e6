import { describe, expect, it } from 'vitest';
import { isInputFileError } from '../../../../core/problems';
import { Rng } from '../../../../core/rng';
import { gatherGeometry } from '../../../../core/segy/geometry';
import { indexGathers, parseGatherKey, readGather } from '../../../../core/segy/gathers';
import { openSegy } from '../../../../core/segy/open';
import { parseTraceHeader, type TraceHeader } from '../../../../core/segy/trace-header';
import { fixture } from './fixtures';

interface H { sx?: number; sy?: number; rx?: number; ry?: number; offset?: number; id?: number; scalar?: number; units?: number }
function header(h: H): TraceHeader {
  const b = new Uint8Array(240);
  const v = new DataView(b.buffer);
  v.setInt16(28, h.id ?? 1);
  v.setInt32(36, h.offset ?? 0);
  v.setInt16(70, h.scalar ?? 1);
  v.setInt32(72, h.sx ?? 0);
  v.setInt32(76, h.sy ?? 0);
  v.setInt32(80, h.rx ?? 0);
  v.setInt32(84, h.ry ?? 0);
  v.setInt16(88, h.units ?? 1);
  return parseTraceHeader(b, 0, false, 'm');
}
const live = (n: number, nSamples: number) => new Float32Array(n * nSamples).fill(1);

describe('gatherGeometry', () => {
  it('shot gather along a diagonal line: receiver positions, spacing, and a gap', () => {
    // Receivers every 12.5 m along a 30° line; positions 4..6 absent. Coordinates in cm (scalar −100).
    const hs: TraceHeader[] = [];
    for (let i = 0; i < 20; i++) {
      if (i >= 4 && i <= 6) continue;
      const d = i * 12.5;
      hs.push(header({ sx: 0, sy: 0, rx: Math.round(100 * (500 + d * Math.cos(Math.PI / 6))), ry: Math.round(100 * (800 + d * Math.sin(Math.PI / 6))), scalar: -100 }));
    }
    const g = gatherGeometry(hs, live(hs.length, 3), 3);
    expect(g.positionSource).toBe('receiver');
    expect(g.spacingM).toBeCloseTo(12.5, 3);
    expect(g.gridCount).toBe(20);
    expect(Array.from(g.missingGrid)).toEqual([4, 5, 6]);
    expect(g.deadGrid.length).toBe(0);
    expect(g.maxJitter).toBeLessThan(0.01);
  });

  it('tolerates position jitter and unsorted traces', () => {
    const rng = new Rng(11);
    const order = [3, 0, 1, 2, 7, 6, 5, 4, 8, 9, 10, 12, 11];
    const hs = order.map((i) => header({ rx: Math.round(1000 * (i * 25 + (rng.uniform() - 0.5) * 6)), scalar: -1000, sx: 5 }));
    const g = gatherGeometry(hs, live(hs.length, 2), 2);
    expect(g.spacingM).toBeGreaterThan(24.5);
    expect(g.spacingM).toBeLessThan(25.5);
    expect(Array.from(g.gridIndexOfTrace)).toEqual(order.map((i) => i));
    expect(g.missingGrid.length).toBe(0);
    expect(g.warnings.length).toBe(0);
  });

  it('a strongly jittered first trace does not set the grid (phase taken over all traces)', () => {
    // Jitter of ±5 m on 25 m (20%): first trace late, several others early. Measured from the first trace alone,
    // traces would sit 40% off the grid; centred on all traces, at most 20%.
    const jitter = [5, -5, -4, 3, -5, 4, -3, 5, -5, 0];
    const hs = jitter.map((j, i) => header({ rx: 100 * (i * 25 + j), scalar: -100 }));
    const g = gatherGeometry(hs, live(hs.length, 1), 1);
    expect(g.spacingM).toBeGreaterThan(24);
    expect(g.spacingM).toBeLessThan(26);
    expect(Array.from(g.gridIndexOfTrace)).toEqual(jitter.map((_, i) => i));
    expect(g.missingGrid.length).toBe(0);
  });

  it('receiver gather: source positions; CMP gather: offsets', () => {
    const rg = [0, 1, 2, 3].map((i) => header({ sx: 100 * i, rx: 7 }));
    expect(gatherGeometry(rg, live(4, 1), 1).positionSource).toBe('source');
    const cmp = [0, 1, 2, 3, 5].map((i) => header({ sx: 1000 - 50 * i, rx: 1000 + 50 * i, offset: 100 * i }));
    const g = gatherGeometry(cmp, live(5, 1), 1);
    expect(g.positionSource).toBe('offset');
    expect(g.spacingM).toBeCloseTo(100, 9);
    expect(Array.from(g.missingGrid)).toEqual([4]);
  });

  it('geographic coordinates (arc-seconds) become metres', () => {
    // 1 arc-second of latitude ≈ 30.87 m (6 371 km mean radius): receivers 1″ apart northwards.
    const hs = [0, 1, 2, 3].map((i) => header({ rx: 200000, ry: 180000 + i, units: 2 }));
    const g = gatherGeometry(hs, live(4, 1), 1);
    expect(g.spacingM).toBeCloseTo((6371000 * Math.PI) / 180 / 3600, 6);
  });

  it('trace order: no geometry in the headers, with and without a given spacing', () => {
    const hs = [0, 1, 2].map(() => header({}));
    const a = gatherGeometry(hs, live(3, 1), 1);
    expect(a.positionSource).toBe('trace-order');
    expect(a.spacingM).toBeNaN();
    expect(a.warnings.map((w) => w.code)).toEqual(['geometry.no-spacing']);
    const b = gatherGeometry(hs, live(3, 1), 1, { spacingM: 0.0133 });
    expect(Array.from(b.positionsM)).toEqual([0, 0.0133, 0.0266]);
    expect(b.warnings.length).toBe(0);
  });

  it('a user spacing finer than the data exposes decimation', () => {
    const hs = [0, 2, 4, 6].map((i) => header({ rx: 25 * i }));
    const g = gatherGeometry(hs, live(4, 1), 1, { spacingM: 25 });
    expect(g.gridCount).toBe(7);
    expect(Array.from(g.missingGrid)).toEqual([1, 3, 5]);
  });

  it('dead traces: ID code 2 or all-zero samples', () => {
    const hs = [0, 1, 2, 3].map((i) => header({ rx: 10 * i, id: i === 1 ? 2 : 1 }));
    const data = live(4, 3);
    data.fill(0, 2 * 3, 3 * 3);
    expect(Array.from(gatherGeometry(hs, data, 3).deadGrid)).toEqual([1, 2]);
  });

  it('refuses two traces on one grid position and absurd grids', () => {
    const dup = [0, 1, 1, 2].map((i) => header({ rx: 10 * i }));
    try {
      gatherGeometry(dup, live(4, 1), 1);
      throw new Error('no error');
    } catch (e) {
      expect(isInputFileError(e) && e.problem.code).toBe('geometry.irregular');
    }
    const outlier = [0, 1, 2, 1e6].map((i) => header({ rx: 10 * i }));
    expect(() => gatherGeometry(outlier, live(4, 1), 1)).toThrow(/regular line/);
  });

  it('two-gathers fixture: a gap with a dead trace, and a decimated gather with a zero trace', async () => {
    const f = await openSegy(fixture('two-gathers.sgy'));
    const idx = await indexGathers(f, parseGatherKey('record'));
    expect(idx.gathers.map((g) => [g.keyValue, g.traceIndices.length])).toEqual([[201, 13], [202, 9]]);
    const a = await readGather(f, idx, 0);
    const ga = gatherGeometry(a.headers, a.data, a.nSamples);
    expect([ga.gridCount, Array.from(ga.missingGrid), Array.from(ga.deadGrid), ga.spacingM]).toEqual([16, [5, 6, 7], [11], 25]);
    const b = await readGather(f, idx, 1);
    const gb = gatherGeometry(b.headers, b.data, b.nSamples);
    expect([gb.gridCount, Array.from(gb.missingGrid), Array.from(gb.deadGrid)]).toEqual([16, [1, 3, 5, 7, 9, 11, 13], [4]]);
    expect(gb.spacingM).toBeCloseTo(25, 9);
  });
});

describe('gather keys and index', () => {
  it('parses names, field names and byte positions', () => {
    expect(parseGatherKey('cdp')).toMatchObject({ byte: 21, sizeBytes: 4 });
    expect(parseGatherKey('receiver')).toMatchObject({ byte: 81, sizeBytes: 4 });
    expect(parseGatherKey('field-record')).toMatchObject({ byte: 9, sizeBytes: 4 });
    expect(parseGatherKey('TRACE_ID_CODE')).toMatchObject({ byte: 29, sizeBytes: 2 });
    expect(parseGatherKey('189')).toMatchObject({ byte: 189, sizeBytes: 4 });
    expect(parseGatherKey('29:2')).toMatchObject({ byte: 29, sizeBytes: 2 });
    for (const bad of ['238', '0', 'nonsense', '240:2', '12:3'])
      expect(() => parseGatherKey(bad)).toThrow(/\[segy\.bad-key\]/);
  });

  it('gives the same index and data whatever the batch size (batching is invisible)', async () => {
    const f = await openSegy(fixture('two-gathers.sgy'));
    const big = await indexGathers(f, parseGatherKey('record'));
    const small = await indexGathers(f, parseGatherKey('record'), { batchBytes: 1 });
    expect(small).toEqual(big);
    const a = await readGather(f, big, 1);
    const b = await readGather(f, big, 1, { batchBytes: 700 });
    expect(b.data).toEqual(a.data);
    expect(b.rawHeaders).toEqual(a.rawHeaders);
  });

  it('reads headers in batches, not one read per trace', async () => {
    const src = fixture('two-gathers.sgy');
    let reads = 0;
    const counting = { ...src, read: (o: number, n: number) => { reads++; return src.read(o, n); } };
    const f = await openSegy(counting);
    reads = 0;
    await indexGathers(f, parseGatherKey('record'));
    expect(reads).toBe(1);
  });
});
