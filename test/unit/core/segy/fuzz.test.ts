/**
 * Seeded fuzzing: real files (the fixtures, and copies in memory of ../shared/data/f3.sgy and WL1.sgy when
 * present) are mutated thousands of times. Every outcome must be a successful read with finite samples or
 * an InputFileError with a code; never another exception, a hang, or a NaN. 1850 mutations, each read
 * strictly and leniently (3700 reads); every third strict read that succeeds is also written back with its
 * gaps filled and the output re-opened.
 */
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { isInputFileError } from '../../../../core/problems';
import { Rng } from '../../../../core/rng';
import { memoryByteSource } from '../../../../core/segy/byte-source';
import { BINARY_HEADER, TRACE_HEADER } from '../../../../core/segy/fields';
import { gatherGeometry } from '../../../../core/segy/geometry';
import { indexGathers, parseGatherKey, readGather } from '../../../../core/segy/gathers';
import { openSegy } from '../../../../core/segy/open';
import { SegyWriter } from '../../../../core/segy/writer';
import { fixtureBytes } from './fixtures';

const DATA = new URL('../../../../../shared/data/', import.meta.url).pathname;
const EXTREMES = [0, 1, -1, 2, 0x7f, 0x80, 0xff, 0x7fff, 0x8000, 0xffff, 0x7fffffff, 0x80000000, 0xffffffff];

function mutate(src: Uint8Array, rng: Rng): Uint8Array {
  const b = src.slice();
  const v = new DataView(b.buffer);
  const kind = rng.int(0, 7);
  const fields = Object.values(BINARY_HEADER);
  const tfields = Object.values(TRACE_HEADER);
  const n = 1 + rng.int(0, 4);
  for (let m = 0; m < n; m++) {
    switch (kind) {
      case 0: { // a binary header field to an extreme
        const f = fields[rng.int(0, fields.length)];
        const x = EXTREMES[rng.int(0, EXTREMES.length)];
        if (f.kind === 'i16' || f.kind === 'u16') v.setUint16(f.byte - 1, x & 0xffff);
        else if (f.kind === 'u8') v.setUint8(f.byte - 1, x & 0xff);
        else v.setUint32(f.byte - 1, x >>> 0);
        break;
      }
      case 1: { // a trace header field of a random trace to an extreme
        const f = tfields[rng.int(0, tfields.length)];
        const at = 3600 + rng.int(0, Math.max(1, b.length - 3840)) ;
        const p = Math.min(b.length - 4, at + f.byte - 1);
        if (p >= 0) v.setUint32(p, EXTREMES[rng.int(0, EXTREMES.length)] >>> 0);
        break;
      }
      case 2: // random bytes in the binary header
        b[3200 + rng.int(0, 400)] = rng.int(0, 256);
        break;
      case 3: // random bytes anywhere
        b[rng.int(0, b.length)] = rng.int(0, 256);
        break;
      case 4: // a NaN/Inf/huge word among the samples
        v.setUint32(3600 + 240 + 4 * rng.int(0, Math.max(1, (b.length - 3844) / 4)), [0x7fc00000, 0x7f800000, 0xff800000, 0x7fffffff, 0x7f7fffff][rng.int(0, 5)]);
        break;
      default:
        break;
    }
  }
  if (kind === 5) return b.slice(0, rng.int(0, b.length)); // truncation
  if (kind === 6) { // extension with junk
    const e = new Uint8Array(b.length + rng.int(1, 900));
    e.set(b);
    for (let i = b.length; i < e.length; i++) e[i] = rng.int(0, 256);
    return e;
  }
  return b;
}

async function readEverything(bytes: Uint8Array, strict: boolean, write: boolean): Promise<void> {
  const f = await openSegy(memoryByteSource('fuzz.sgy', bytes), { strict });
  const writer = write ? new SegyWriter(f, { method: 'fuzz' }) : undefined;
  const parts: Uint8Array[] = writer ? [writer.headerBytes()] : [];
  expect(f.traceCount).toBeGreaterThan(0);
  expect(Number.isFinite(f.sampleIntervalUs) || !strict).toBe(true);
  const idx = await indexGathers(f, parseGatherKey('record'));
  for (let i = 0; i < idx.gathers.length; i++) {
    const g = await readGather(f, idx, i);
    for (let k = 0; k < g.data.length; k++) if (!Number.isFinite(g.data[k])) throw new Error(`non-finite sample ${g.data[k]} at ${k} read without an error`);
    try {
      const geo = gatherGeometry(g.headers, g.data, g.nSamples);
      if (geo.positionSource !== 'trace-order' && !Number.isFinite(geo.spacingM)) throw new Error(`spacing ${geo.spacingM} from ${geo.positionSource}`);
      for (const p of geo.positionsM) if (geo.positionSource !== 'trace-order' && !Number.isFinite(p)) throw new Error('non-finite position');
      if (writer) {
        // Fill every missing or dead position with a ramp: the writer must cope with whatever headers got through.
        const filled = new Uint8Array(geo.gridCount);
        const gridData = new Float32Array(geo.gridCount * g.nSamples);
        for (let k = 0; k < geo.gridCount; k++) if (geo.traceOfGrid[k] < 0) { filled[k] = 1; gridData.fill(k, k * g.nSamples, (k + 1) * g.nSamples); }
        for (const k of geo.deadGrid) filled[k] = 1;
        parts.push(writer.encodeGather({ gather: g, geometry: geo, gridData, filled }));
      }
    } catch (e) {
      if (!isInputFileError(e)) throw e;
    }
  }
  if (writer) {
    const { patches, summary } = writer.finish();
    const out = new Uint8Array(parts.reduce((a, p) => a + p.length, 0));
    let at = 0;
    for (const p of parts) { out.set(p, at); at += p.length; }
    for (const p of patches) out.set(p.bytes, p.offsetBytes);
    if (summary.tracesWritten > 0) {
      const back = await openSegy(memoryByteSource('fuzz-out.sgy', out), { strict: false });
      expect(back.traceCount).toBe(summary.tracesWritten);
    }
  }
}

describe('SEG-Y fuzzing', () => {
  const sources: [string, Uint8Array, number][] = [
    ['good.sgy', fixtureBytes('good.sgy'), 500],
    ['good-le.sgy', fixtureBytes('good-le.sgy'), 300],
    ['good-ibm.sgy', fixtureBytes('good-ibm.sgy'), 300],
    ['two-gathers.sgy', fixtureBytes('two-gathers.sgy'), 300],
    ['ascii-ext.sgy', fixtureBytes('ascii-ext.sgy'), 200],
  ];
  for (const name of ['f3.sgy', 'WL1.sgy']) {
    if (existsSync(DATA + name)) sources.push([name, new Uint8Array(readFileSync(DATA + name)), name === 'f3.sgy' ? 100 : 150]);
    else if (process.env.CI) throw new Error(`../shared/data/${name} is missing (required under CI)`);
    else console.warn(`SKIPPING fuzzing of ${name}: ../shared/data/${name} not found next to the project`);
  }

  it.each(sources)('%s: every mutation reads cleanly or gives a coded InputFileError', async (_name, bytes, count) => {
    const rng = new Rng(20261201 + bytes.length);
    const outcomes = { ok: 0, coded: 0 };
    for (let i = 0; i < count; i++) {
      const m = mutate(bytes, rng);
      for (const strict of [true, false]) {
        try {
          await readEverything(m, strict, strict && i % 3 === 0);
          outcomes.ok++;
        } catch (e) {
          if (!isInputFileError(e)) throw new Error(`mutation ${i} (strict ${strict}) threw a non-input error: ${e instanceof Error ? e.stack : String(e)}`);
          expect(e.problem.code).toMatch(/^(segy|geometry|input)\./);
          outcomes.coded++;
        }
      }
    }
    // Both outcomes occur: the mutations are neither all harmless nor all fatal.
    expect(outcomes.ok).toBeGreaterThan(0);
    expect(outcomes.coded).toBeGreaterThan(0);
  });
});
