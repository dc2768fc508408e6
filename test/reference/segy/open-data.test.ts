/**
 * The open datasets of ../shared/data/ (README.md there) read to the values listed there, which were read
 * with Debian's python3-segyio 1.8.3: f3.sgy (F3 block crop, CC BY-SA 3.0, via equinor/segyio test-data)
 * and WL1.sgy (physical-model shot gather, Lorenzo et al., Computers & Geosciences benchmark data).
 * Skips with a message when the folder is absent (fails under CI=true).
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { openFileByteSource } from '../../../app/host/file-source';
import { gatherGeometry } from '../../../core/segy/geometry';
import { indexGathers, parseGatherKey, readGather } from '../../../core/segy/gathers';
import { openSegy, type SegyFile } from '../../../core/segy/open';
import { missingOutside } from '../../support/outside';

const DATA = new URL('../../../../shared/data/', import.meta.url).pathname;
const present = existsSync(DATA + 'f3.sgy') && existsSync(DATA + 'WL1.sgy');
if (!present) {
  missingOutside('SKIPPING open-data SEG-Y checks: ../shared/data/f3.sgy and WL1.sgy not found next to the project (required under CI)');
}

async function allSamples(f: SegyFile, key = 'record') {
  const idx = await indexGathers(f, parseGatherKey(key));
  const traces: Float32Array[] = [];
  const order: number[] = [];
  for (let i = 0; i < idx.gathers.length; i++) {
    const g = await readGather(f, idx, i);
    for (let t = 0; t < g.nTraces; t++) {
      traces.push(g.data.subarray(t * g.nSamples, (t + 1) * g.nSamples));
      order.push(g.traceIndices[t]);
    }
  }
  const byFile: Float32Array[] = [];
  order.forEach((ti, k) => (byFile[ti] = traces[k]));
  let sum = 0, sumSq = 0, min = Infinity, max = -Infinity;
  for (const tr of byFile) for (const v of tr) { sum += v; sumSq += v * v; if (v < min) min = v; if (v > max) max = v; }
  return { idx, byFile, sum, sumSq, min, max };
}

describe.skipIf(!present)('open datasets', () => {
  it('f3.sgy: layout, checksum and sample statistics as listed in ../shared/data/README.md', async () => {
    expect(createHash('sha256').update(readFileSync(DATA + 'f3.sgy')).digest('hex')).toBe('6008d05547c6b8f6050cea7ca4683f1be3fac260235cad47eb5e61ee05d2ce23');
    const src = await openFileByteSource(DATA + 'f3.sgy');
    try {
      const f = await openSegy(src);
      expect([f.traceCount, f.nSamples, f.sampleIntervalUs, f.formatCode, f.byteOrder, f.textEncoding]).toEqual([414, 75, 4000, 3, 'big', 'ebcdic']);
      // The trace headers say 462 samples; the binary header's 75 fits the file size (README: 75 samples).
      expect(f.warnings.map((w) => w.code)).toEqual(['segy.header-contradiction']);
      const s = await allSamples(f, 'inline');
      expect(s.idx.gathers.length).toBe(23); // inlines 111–133
      expect(s.idx.gathers[0].keyValue).toBe(111);
      expect(Array.from(s.byFile[0].subarray(0, 5))).toEqual([0, 0, 0, 0, 0]);
      expect(s.sum).toBe(780251);
      expect(s.sumSq).toBe(144915152529);
      expect([s.min, s.max]).toEqual([-10239, 10827]);
      // Crosslines 875–892 in bytes 193–196: 18 traces per inline, CDP coordinates 25 m apart (F3 bin size, from memory).
      const g = await readGather(f, s.idx, 0);
      expect(g.headers.map((h) => h.fields.CROSSLINE)).toEqual(Array.from({ length: 18 }, (_, i) => 875 + i));
      const geo = gatherGeometry(g.headers, g.data, g.nSamples);
      expect(geo.gridCount).toBe(18);
      expect(geo.spacingM).toBeGreaterThan(24.9);
      expect(geo.spacingM).toBeLessThan(25.1);
    } finally {
      await src.close();
    }
  });

  it('WL1.sgy: layout, checksum, samples and geometry-free gather as listed in ../shared/data/README.md', async () => {
    expect(createHash('sha256').update(readFileSync(DATA + 'WL1.sgy')).digest('hex')).toBe('14d330be1ccdac024558233950b69d910eaa976618ce623af7721cfca82c2c1d');
    const src = await openFileByteSource(DATA + 'WL1.sgy');
    try {
      const f = await openSegy(src);
      expect([f.traceCount, f.nSamples, f.sampleIntervalUs, f.formatCode, f.byteOrder, f.textEncoding]).toEqual([64, 780, 13, 1, 'big', 'ebcdic']);
      const s = await allSamples(f);
      // Values segyio 1.8.3 reads (README); IBM → Float32 is exact in range, so these compare exactly.
      expect(Array.from(s.byFile[0].subarray(0, 3))).toEqual([4.687819480895996, 3.642289161682129, 5.36313533782959]);
      expect(Array.from(s.byFile[63].subarray(10, 13))).toEqual([0.023767296224832535, -0.3329036831855774, 0.02441529929637909]);
      expect(s.sumSq).toBeCloseTo(24392968.06, 1); // README gives two decimals
      expect([s.min, s.max]).toEqual([-270.837646484375, 390.329833984375]);
      const g = await readGather(f, s.idx, 0);
      const geo = gatherGeometry(g.headers, g.data, g.nSamples, { spacingM: 0.0133 });
      expect(geo.positionSource).toBe('trace-order');
      expect(geo.gridCount).toBe(64);
      expect(geo.missingGrid.length + geo.deadGrid.length).toBe(0);
    } finally {
      await src.close();
    }
  });
});
