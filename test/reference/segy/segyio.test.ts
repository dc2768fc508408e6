/**
 * Cross-reading with Debian's python3-segyio (an independent SEG-Y implementation):
 * 1. files written by segyio in every format it can write, both byte orders, read by Dipweave to the exact
 *    values segyio reads back (segyio_write.py);
 * 2. files written by Dipweave (SegyWriter through app/host/segy-output.ts) read by segyio with the same
 *    samples and headers (segyio_read.py).
 * Needs /usr/bin/python3 with segyio and numpy: fails under CI=true when missing, else skips loudly.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openFileByteSource } from '../../../app/host/file-source';
import { writeFilledSegy } from '../../../app/host/segy-output';
import { gatherGeometry } from '../../../core/segy/geometry';
import { indexGathers, parseGatherKey, readGather, readTraces } from '../../../core/segy/gathers';
import { openSegy } from '../../../core/segy/open';
import type { OutputGather } from '../../../core/segy/writer';
import { missingOutside } from '../../support/outside';

const PY = '/usr/bin/python3';
const HERE = new URL('.', import.meta.url).pathname;
const FIXTURES = new URL('../../fixtures/segy/', import.meta.url).pathname;
const probe = spawnSync(PY, ['-c', 'import segyio, numpy'], { encoding: 'utf8' });
const available = probe.status === 0;
if (!available) {
  const msg = 'python3-segyio is not available at /usr/bin/python3: install it with `apt-get install -y python3-segyio python3-numpy`';
  missingOutside(`SKIPPING segyio cross-reading tests: ${msg}`);
}

const tmp = mkdtempSync(join(tmpdir(), 'dipweave-segyio-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

interface Manifest {
  segyio: string;
  files: { path: string; format: number; endian: 'big' | 'little'; samples: number[][]; headers: Record<string, number>[]; interval: number }[];
  skipped: { format: number; endian: string; reason: string }[];
}

describe.skipIf(!available)('segyio → Dipweave', () => {
  it('reads every file segyio writes to segyio\'s exact values', async () => {
    const r = spawnSync(PY, [join(HERE, 'segyio_write.py'), tmp], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const m = JSON.parse(readFileSync(join(tmp, 'manifest.json'), 'utf8')) as Manifest;
    // segyio 1.8.3 writes formats 1, 2 and 5 (both byte orders); its 1- and 2-byte writes are one sample
    // short, and it does not know the rev 2 formats (the skipped list says why, per format).
    const written = m.files.map((f) => `${f.format}/${f.endian}`);
    for (const need of ['1/big', '1/little', '2/big', '2/little', '5/big', '5/little']) expect(written).toContain(need);
    for (const spec of m.files) {
      const src = await openFileByteSource(spec.path);
      try {
        const f = await openSegy(src);
        expect([f.formatCode, f.byteOrder, f.traceCount, f.nSamples, f.sampleIntervalUs]).toEqual([spec.format, spec.endian, 7, 23, spec.interval]);
        const g = await readGather(f, await indexGathers(f, parseGatherKey('record')), 0);
        for (let i = 0; i < 7; i++) {
          for (let s = 0; s < 23; s++) {
            const want = spec.samples[i][s];
            const got = g.data[i * 23 + s];
            if (got !== want) throw new Error(`${spec.path}: trace ${i} sample ${s}: Dipweave ${got}, segyio ${want} (tolerance 0)`);
          }
          const h = g.headers[i];
          for (const [name, value] of Object.entries(spec.headers[i])) expect(h.fields[name as 'OFFSET'], `${spec.path} trace ${i} ${name}`).toBe(value);
          // Scalars: −100 on coordinates, −10 on elevations (SEG-Y rev 1 bytes 69–72).
          expect(h.receiverX).toBeCloseTo(spec.headers[i].RECEIVER_X / 100, 9);
          expect(h.receiverElevationM).toBeCloseTo(spec.headers[i].RECEIVER_ELEVATION / 10, 9);
        }
      } finally {
        await src.close();
      }
    }
  });
});

describe.skipIf(!available)('fixtures read alike by segyio and Dipweave', () => {
  it.each(['good.sgy', 'good-le.sgy', 'good-le-guess.sgy', 'good-ibm.sgy', 'good-int16.sgy', 'good-int8.sgy', 'ascii-ext.sgy', 'rev0.sgy', 'two-gathers.sgy'])('%s', async (name) => {
    const src = await openFileByteSource(join(FIXTURES, name));
    try {
      const f = await openSegy(src);
      const r = spawnSync(PY, [join(HERE, 'segyio_read.py'), join(FIXTURES, name), f.byteOrder], { encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      const seen = JSON.parse(r.stdout) as { tracecount: number; samples: number[][]; headers: Record<string, number>[] };
      expect(seen.tracecount).toBe(f.traceCount);
      const g = await readTraces(f, 0, Int32Array.from({ length: f.traceCount }, (_, i) => i));
      for (let t = 0; t < f.traceCount; t++) {
        for (let s = 0; s < f.nSamples; s++)
          if (g.data[t * f.nSamples + s] !== seen.samples[t][s]) throw new Error(`${name} trace ${t} sample ${s}: Dipweave ${g.data[t * f.nSamples + s]}, segyio ${seen.samples[t][s]}`);
        for (const k of ['TRACE_SEQUENCE_IN_FILE', 'FIELD_RECORD', 'TRACE_ID_CODE', 'OFFSET', 'RECEIVER_X', 'COORDINATE_SCALAR'] as const)
          expect(g.headers[t].fields[k], `${name} trace ${t} ${k}`).toBe(seen.headers[t][k]);
      }
    } finally {
      await src.close();
    }
  });
});

describe.skipIf(!available)('Dipweave → segyio', () => {
  it.each([
    ['two-gathers.sgy', 'same'],
    ['good-ibm.sgy', 'same'],
    ['good-int16.sgy', 'same'],
    ['good-int8.sgy', 'same'],
    ['good-le.sgy', 'same'],
    ['good-ibm.sgy', 5],
  ] as const)('%s written (format %s) is read by segyio with the same samples and headers', async (name, formatCode) => {
    const inPath = join(FIXTURES, name);
    const outPath = join(tmp, `out-${formatCode}-${name}`);
    const src = await openFileByteSource(inPath);
    const expectedSamples: number[][] = [];
    const expectedFlags: number[] = [];
    let file;
    try {
      file = await openSegy(src);
      const f = file;
      const idx = await indexGathers(f, parseGatherKey('record'));
      await writeFilledSegy(outPath, inPath, f, { method: 'test fill: a ramp in each missing trace', formatCode }, async (sink) => {
        for (let gi = 0; gi < idx.gathers.length; gi++) {
          const g = await readGather(f, idx, gi);
          const geo = gatherGeometry(g.headers, g.data, g.nSamples);
          const n = g.nSamples;
          const gridData = new Float32Array(geo.gridCount * n);
          const filled = new Uint8Array(geo.gridCount);
          for (let k = 0; k < geo.gridCount; k++) {
            const t = geo.traceOfGrid[k];
            // Fill missing positions, plus position 2 as a stand-in for a filled dead trace.
            if (t < 0 || k === 2) {
              filled[k] = 1;
              for (let s = 0; s < n; s++) gridData[k * n + s] = 7 * k - s;
            } else gridData.set(g.data.subarray(t * n, (t + 1) * n), k * n);
            expectedSamples.push(Array.from(gridData.subarray(k * n, (k + 1) * n)));
            expectedFlags.push(filled[k]);
          }
          const out: OutputGather = { gather: g, geometry: geo, gridData, filled };
          await sink.writeGather(out);
        }
      });
    } finally {
      await src.close();
    }
    const r = spawnSync(PY, [join(HERE, 'segyio_read.py'), outPath, file!.byteOrder], { encoding: 'utf8', maxBuffer: 64 << 20 });
    expect(r.status, r.stderr).toBe(0);
    const seen = JSON.parse(r.stdout) as { tracecount: number; format: number; text: string; samples: number[][]; headers: Record<string, number>[] };
    expect(seen.tracecount).toBe(expectedSamples.length);
    expect(seen.format).toBe(formatCode === 5 ? 5 : file!.formatCode);
    expect(seen.text).toContain('FILLED TRACES ARE ESTIMATES');
    for (let i = 0; i < seen.tracecount; i++) {
      for (let s = 0; s < expectedSamples[i].length; s++) {
        const want = expectedSamples[i][s];
        const got = seen.samples[i][s];
        // IBM keeps integers of these magnitudes exactly, so every format compares exactly.
        if (got !== want) throw new Error(`${name} trace ${i} sample ${s}: segyio ${got}, written ${want} (tolerance 0)`);
      }
      const h = seen.headers[i];
      expect(h.TRACE_SEQUENCE_IN_FILE).toBe(i + 1);
      // Flag in bytes 233–234 = 1 (read at the trace layout segyio reports).
      expect(h.BYTES_233_234).toBe(expectedFlags[i] ? 1 : 0);
      if (expectedFlags[i]) expect(h.TRACE_ID_CODE).toBe(1);
    }
  });
});
