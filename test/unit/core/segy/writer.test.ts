import { describe, expect, it } from 'vitest';
import { memoryByteSource } from '../../../../core/segy/byte-source';
import { FILLED_FLAG_VALUE } from '../../../../core/segy/fields';
import { gatherGeometry, type GatherGeometry } from '../../../../core/segy/geometry';
import { indexGathers, parseGatherKey, readGather, type LoadedGather } from '../../../../core/segy/gathers';
import { openSegy, type SegyFile } from '../../../../core/segy/open';
import { decodeText, encodeText } from '../../../../core/segy/text';
import { SegyWriter, type OutputGather, type WriterOptions } from '../../../../core/segy/writer';
import { fixtureBytes } from './fixtures';

const METHOD = 'plane-wave least squares along estimated slopes (test)';

/** Fill every missing and dead grid position with value 1000·k + s (exact in every format used). */
function fillAll(g: LoadedGather, geo: GatherGeometry): OutputGather {
  const n = g.nSamples;
  const gridData = new Float32Array(geo.gridCount * n);
  const filled = new Uint8Array(geo.gridCount);
  for (let k = 0; k < geo.gridCount; k++) {
    const t = geo.traceOfGrid[k];
    if (t >= 0) gridData.set(g.data.subarray(t * n, (t + 1) * n), k * n);
  }
  for (const k of [...geo.missingGrid, ...geo.deadGrid]) {
    filled[k] = 1;
    for (let s = 0; s < n; s++) gridData[k * n + s] = 1000 * k + s;
  }
  return { gather: g, geometry: geo, gridData, filled };
}

async function writeAll(file: SegyFile, options: WriterOptions, edit?: (o: OutputGather) => void) {
  const w = new SegyWriter(file, options);
  const parts: Uint8Array[] = [w.headerBytes()];
  const idx = await indexGathers(file, parseGatherKey('record'));
  const inputs: OutputGather[] = [];
  for (let i = 0; i < idx.gathers.length; i++) {
    const g = await readGather(file, idx, i);
    const o = fillAll(g, gatherGeometry(g.headers, g.data, g.nSamples));
    edit?.(o);
    inputs.push(o);
    parts.push(w.encodeGather(o));
  }
  const { patches, summary } = w.finish();
  const out = new Uint8Array(parts.reduce((a, p) => a + p.length, 0));
  let at = 0;
  for (const p of parts) { out.set(p, at); at += p.length; }
  for (const p of patches) out.set(p.bytes, p.offsetBytes);
  return { out, summary, inputs };
}

describe('SegyWriter', () => {
  it('keeps originals byte for byte (but sequence numbers), fills and flags new traces, interpolates their headers', async () => {
    const inBytes = fixtureBytes('two-gathers.sgy');
    const file = await openSegy(memoryByteSource('two-gathers.sgy', inBytes));
    const { out, summary, inputs } = await writeAll(file, { method: METHOD });
    // Gather 201: 16 grid positions (3 missing + 1 dead filled); gather 202: 16 (7 missing + 1 zero trace filled).
    expect(summary.tracesWritten).toBe(32);
    expect(summary.filledTraces).toBe(12);
    const back = await openSegy(memoryByteSource('out.sgy', out));
    expect(back.traceCount).toBe(32);
    expect(Array.from(back.binaryHeader)).toEqual(Array.from(file.binaryHeader));
    const idx = await indexGathers(back, parseGatherKey('record'));
    let outTrace = 0;
    for (let gi = 0; gi < 2; gi++) {
      const g = await readGather(back, idx, gi);
      const { gather: orig, geometry: geo } = inputs[gi];
      const geoBack = gatherGeometry(g.headers, g.data, g.nSamples);
      expect(geoBack.gridCount).toBe(16);
      expect(geoBack.missingGrid.length).toBe(0);
      expect(geoBack.spacingM).toBeCloseTo(25, 9);
      for (let k = 0; k < 16; k++, outTrace++) {
        const h = g.headers[k];
        const raw = g.rawHeaders.subarray(k * 240, (k + 1) * 240);
        expect(h.fields.TRACE_SEQUENCE_IN_FILE).toBe(outTrace + 1);
        const t = geo.traceOfGrid[k];
        const isFilled = t < 0 || geo.deadGrid.includes(k);
        expect(h.fields.DIPWEAVE_FILLED_FLAG).toBe(isFilled ? FILLED_FLAG_VALUE : 0);
        if (isFilled) {
          expect(h.traceIdCode).toBe(1);
          for (let s = 0; s < g.nSamples; s++) expect(g.data[k * g.nSamples + s]).toBe(1000 * k + s);
          expect(h.receiverX).toBeCloseTo(1050 + 25 * k, 6);
          expect(h.offsetM).toBe(50 + 25 * k);
          expect(h.fields.TRACE_IN_FIELD_RECORD).toBe(k + 1);
        } else {
          const origRaw = orig.rawHeaders.subarray(t * 240, (t + 1) * 240);
          expect(Array.from(raw.subarray(8))).toEqual(Array.from(origRaw.subarray(8)));
          expect(Array.from(g.rawSamples.subarray(k * 160, (k + 1) * 160))).toEqual(Array.from(orig.rawSamples.subarray(t * 160, (t + 1) * 160)));
        }
      }
    }
    const note = back.textCards.join('\n');
    expect(note).toContain('FILLED TRACES ARE ESTIMATES, NOT RECORDINGS');
    expect(note).toContain('FLAG: BYTES 233-234 OF EACH FILLED TRACE HEADER = 1 (TRACE ID CODE 1).');
    expect(note).toContain('METHOD: plane-wave least squares');
    expect(note).toContain('FILLED: 12 OF 32 TRACES');
    expect(note).toContain('6-8 12 18 20-22 24 26 28 30');
    // Cards that carried text are untouched.
    for (let c = 0; c < 3; c++) expect(back.textCards[c]).toBe(file.textCards[c]);
    expect(back.textCards[38]).toBe(file.textCards[38]);
  });

  it('wraps a long method description over cards without losing a word', async () => {
    const method = Array.from({ length: 40 }, (_, i) => `step${i}`).join(' ') + ' ' + 'x'.repeat(90);
    const file = await openSegy(memoryByteSource('a', fixtureBytes('good.sgy')));
    const { out } = await writeAll(file, { method }, (o) => { o.filled[5] = 1; });
    const back = await openSegy(memoryByteSource('b', out));
    const bodies = back.textCards.map((c) => c.slice(4).trimEnd()).filter((b) => b.length > 0);
    for (const b of bodies) expect(b.length).toBeLessThanOrEqual(76);
    const joined = bodies.join(' ');
    expect(joined).toContain(`METHOD: ${method.slice(0, 300)}`);
    expect(joined.replace(/ /g, '')).toContain('x'.repeat(90));
  });

  it('keeps sequence numbers and every original header byte when asked not to renumber', async () => {
    const file = await openSegy(memoryByteSource('a', fixtureBytes('two-gathers.sgy')));
    const { out, inputs } = await writeAll(file, { method: METHOD, renumber: false });
    const back = await openSegy(memoryByteSource('b', out));
    const g = await readGather(back, await indexGathers(back, parseGatherKey('record')), 0);
    const { gather: orig, geometry: geo } = inputs[0];
    for (let k = 0; k < 16; k++) {
      const t = geo.traceOfGrid[k];
      if (t < 0 || geo.deadGrid.includes(k)) continue;
      expect(Array.from(g.rawHeaders.subarray(k * 240, (k + 1) * 240))).toEqual(Array.from(orig.rawHeaders.subarray(t * 240, (t + 1) * 240)));
    }
  });

  it('writes IBM like the input, or IEEE float on request with the format code updated', async () => {
    const file = await openSegy(memoryByteSource('ibm', fixtureBytes('good-ibm.sgy')));
    const drop = (o: OutputGather) => { o.filled.fill(0); o.filled[4] = 1; for (let s = 0; s < 50; s++) o.gridData[4 * 50 + s] = 0.1 * s; };
    for (const formatCode of ['same', 5] as const) {
      const { out } = await writeAll(file, { method: METHOD, formatCode }, drop);
      const back = await openSegy(memoryByteSource('o', out));
      expect(back.formatCode).toBe(formatCode === 5 ? 5 : 1);
      const g = await readGather(back, await indexGathers(back, parseGatherKey('record')), 0);
      const orig = await readGather(file, await indexGathers(file, parseGatherKey('record')), 0);
      for (let i = 0; i < 12 * 50; i++) {
        if (i >= 200 && i < 250) expect(Math.abs(g.data[i] - Math.fround(0.1 * (i - 200)))).toBeLessThanOrEqual(2 ** -21 * 5);
        else expect(g.data[i]).toBe(orig.data[i]);
      }
    }
  });

  it('clamps filled samples that exceed an integer format, and says so', async () => {
    const file = await openSegy(memoryByteSource('i16', fixtureBytes('good-int16.sgy')));
    const { summary } = await writeAll(file, { method: METHOD }, (o) => { o.filled[2] = 1; o.gridData.fill(1e6, 100, 150); });
    expect(summary.clampedSamples).toBe(50);
    expect(summary.warnings.map((w) => w.code)).toContain('segy.value-out-of-range');
  });

  it('puts the note in a new extended textual header when the textual header has no free cards', async () => {
    const b = fixtureBytes('good.sgy');
    for (let c = 0; c < 40; c++) encodeText(`C${String(c + 1).padStart(2)} SURVEY NOTE ${c}`.padEnd(80), 'ebcdic', b, c * 80);
    const file = await openSegy(memoryByteSource('full', b));
    const { out } = await writeAll(file, { method: METHOD }, (o) => { o.filled[5] = 1; });
    const back = await openSegy(memoryByteSource('o', out));
    expect(back.extendedTextHeaders.length).toBe(1);
    expect(back.binary.EXTENDED_TEXT_HEADER_COUNT).toBe(1);
    expect(Array.from(back.textHeader)).toEqual(Array.from(file.textHeader));
    const ext = decodeText(back.extendedTextHeaders[0], 'ebcdic');
    expect(ext).toContain('((Dipweave: filled traces))');
    expect(ext).toContain('FILLED: 1 OF 12 TRACES');
    expect(back.traceCount).toBe(12);
  });

  it('treats a non-finite filled sample as a bug, not as data', async () => {
    const file = await openSegy(memoryByteSource('g', fixtureBytes('good.sgy')));
    await expect(writeAll(file, { method: METHOD }, (o) => { o.filled[1] = 1; o.gridData[50] = Number.NaN; })).rejects.toThrow(/non-finite/);
  });
});

describe('SegyWriter on rev 2 files', () => {
  it('sets the number of traces and the first-trace offset to the output layout', async () => {
    const b = fixtureBytes('good-le.sgy');
    const v = new DataView(b.buffer);
    // A rev 2 file stating its first-trace offset (3600) and trace count (12), with no free textual card, so
    // the note goes into a new extended header and both fields must follow the new layout.
    v.setUint32(3520, 3600, true); // 3521–3528, 8-byte unsigned, little-endian low word first
    v.setUint32(3512, 12, true);
    for (let c = 0; c < 40; c++) encodeText(`C${String(c + 1).padStart(2)} FULL ${c}`.padEnd(80), 'ebcdic', b, c * 80);
    const file = await openSegy(memoryByteSource('rev2', b));
    const { out } = await writeAll(file, { method: METHOD }, (o) => { o.filled[3] = 1; });
    const back = await openSegy(memoryByteSource('o', out));
    expect(back.revision).toBe(2);
    expect(back.extendedTextHeaders.length).toBe(1);
    expect(back.binary.FIRST_TRACE_OFFSET_BYTES).toBe(3600 + 3200);
    expect(back.binary.NUMBER_OF_TRACES).toBe(12);
    expect(back.firstTraceOffsetBytes).toBe(6800);
    expect(back.warnings).toEqual([]);
  });
});
