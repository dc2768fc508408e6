// `npm run fixtures`: regenerates the tiny SEG-Y files in test/fixtures/segy/ (listed in its README.md).
// Files are built byte by byte with DataView here, not with core/segy/writer.ts, so the reader's tests do
// not rest on the writer. Deterministic: the same bytes on every run. Invented data only.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { float64ToIbmBits } from '../core/segy/ibm';
import { encodeText } from '../core/segy/text';

const dir = new URL('../test/fixtures/segy/', import.meta.url).pathname;

type Fmt = 1 | 3 | 5 | 8;
interface TraceSpec {
  record: number;
  channel: number;
  receiverXcm: number; // scaled by coordinate scalar −100: centimetres
  sourceXcm: number;
  offsetM: number;
  traceId?: number;
  samplesInTrace?: number;
  intervalUs?: number;
  values: number[];
}
interface FileSpec {
  little?: boolean;
  revision?: 0 | 1 | 2;
  format: Fmt;
  nSamples: number;
  intervalUs: number;
  text?: 'ebcdic' | 'ascii';
  extendedText?: string[];
  byteOrderConstant?: boolean;
  traces: TraceSpec[];
}

const BPS: Record<Fmt, number> = { 1: 4, 3: 2, 5: 4, 8: 1 };

function textHeader(lines: string[], enc: 'ebcdic' | 'ascii'): Uint8Array {
  const out = new Uint8Array(3200);
  for (let i = 0; i < 40; i++) {
    const body = lines[i] ?? '';
    const card = `C${String(i + 1).padStart(2, ' ')} ${body}`.padEnd(80, ' ').slice(0, 80);
    encodeText(card, enc, out, i * 80);
  }
  return out;
}

function build(spec: FileSpec): Uint8Array {
  const little = spec.little ?? false;
  const nExt = spec.extendedText?.length ?? 0;
  const sampleBytes = BPS[spec.format];
  const traceBytes = 240 + spec.nSamples * sampleBytes;
  const out = new Uint8Array(3600 + nExt * 3200 + spec.traces.length * traceBytes);
  const v = new DataView(out.buffer);
  const enc = spec.text ?? 'ebcdic';
  out.set(textHeader([
    'DIPWEAVE TEST FIXTURE (INVENTED DATA)',
    'LINE: HARROWMERE TEST LINE 7, INVENTED FOR TESTS',
    `SAMPLE FORMAT ${spec.format}, ${little ? 'LITTLE' : 'BIG'}-ENDIAN`,
    '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '',
    '',
    spec.revision === 2 ? 'SEG-Y_REV2.0' : spec.revision === 0 ? '' : 'SEG Y REV1',
    'END TEXTUAL HEADER',
  ], enc), 0);
  // Binary header (file byte positions − 1).
  v.setInt32(3200, 1, little); // job id
  v.setInt32(3204, 7, little); // line number
  v.setInt16(3212, spec.traces.length, little);
  v.setInt16(3216, spec.intervalUs, little);
  v.setUint16(3220, spec.nSamples, little);
  v.setInt16(3224, spec.format, little);
  v.setInt16(3228, 1, little); // sorting: as recorded
  v.setInt16(3254, 1, little); // metres
  if (spec.byteOrderConstant) v.setUint32(3296, 0x01020304, little);
  const rev = spec.revision ?? 1;
  if (rev === 1) { out[3500] = 1; out[3501] = 0; }
  if (rev === 2) { out[3500] = 2; out[3501] = 0; }
  if (rev >= 1) { v.setInt16(3502, 1, little); v.setInt16(3504, nExt, little); }
  for (let k = 0; k < nExt; k++) out.set(encodeText(spec.extendedText![k].padEnd(3200, ' '), enc, new Uint8Array(3200)), 3600 + k * 3200);
  let p = 3600 + nExt * 3200;
  spec.traces.forEach((t, i) => {
    v.setInt32(p + 0, i + 1, little);
    v.setInt32(p + 4, i + 1, little);
    v.setInt32(p + 8, t.record, little);
    v.setInt32(p + 12, t.channel, little);
    v.setInt32(p + 16, t.record, little); // source point
    v.setInt16(p + 28, t.traceId ?? 1, little);
    v.setInt32(p + 36, t.offsetM, little);
    v.setInt16(p + 68, 1, little); // elevation scalar
    v.setInt16(p + 70, -100, little); // coordinate scalar: divide by 100
    v.setInt32(p + 72, t.sourceXcm, little);
    v.setInt32(p + 76, 500000, little); // source Y = 5000.00 m
    v.setInt32(p + 80, t.receiverXcm, little);
    v.setInt32(p + 84, 500000, little);
    v.setInt16(p + 88, 1, little); // coordinate units: length
    v.setUint16(p + 114, t.samplesInTrace ?? spec.nSamples, little);
    v.setInt16(p + 116, t.intervalUs ?? spec.intervalUs, little);
    p += 240;
    for (let s = 0; s < spec.nSamples; s++, p += sampleBytes) {
      const x = t.values[s];
      if (spec.format === 5) v.setFloat32(p, x, little);
      else if (spec.format === 3) v.setInt16(p, x, little);
      else if (spec.format === 8) v.setInt8(p, x);
      else v.setUint32(p, float64ToIbmBits(x), little);
    }
  });
  return out;
}

/** Sample value of trace i, sample s: an integer (exact in every format used here), zero-mean-ish. */
function value(i: number, s: number): number {
  return ((i + 1) * 37 + s * 11) % 201 - 100;
}

function shot(record: number, nTraces: number, nSamples: number, opts: { absent?: number[]; dead?: number[]; zero?: number[] } = {}): TraceSpec[] {
  const traces: TraceSpec[] = [];
  const sourceXcm = 100000; // source at 1000.00 m
  for (let i = 0; i < nTraces; i++) {
    if (opts.absent?.includes(i)) continue;
    const receiverXcm = 105000 + i * 2500; // 1050 m + 25 m per channel
    traces.push({
      record, channel: i + 1, receiverXcm, sourceXcm, offsetM: Math.round((receiverXcm - sourceXcm) / 100),
      traceId: opts.dead?.includes(i) ? 2 : 1,
      values: Array.from({ length: nSamples }, (_, s) => (opts.zero?.includes(i) ? 0 : value(i + record, s))),
    });
  }
  return traces;
}

const N = 50;
const good: FileSpec = { format: 5, nSamples: N, intervalUs: 2000, traces: shot(101, 12, N) };
const files: Record<string, Uint8Array> = {
  'good.sgy': build(good),
  'good-le.sgy': build({ ...good, little: true, revision: 2, byteOrderConstant: true }),
  'good-le-guess.sgy': build({ ...good, little: true }),
  'good-ibm.sgy': build({ ...good, format: 1 }),
  'good-int16.sgy': build({ ...good, format: 3 }),
  'good-int8.sgy': build({ ...good, format: 8 }),
  'ascii-ext.sgy': build({ ...good, text: 'ascii', extendedText: ['((Harrowmere: survey notes)) Invented extended textual header for tests.'] }),
  'rev0.sgy': build({ ...good, revision: 0 }),
  'two-gathers.sgy': build({
    ...good, nSamples: 40,
    traces: [...shot(201, 16, 40, { absent: [5, 6, 7], dead: [11] }), ...shot(202, 16, 40, { absent: [1, 3, 5, 7, 9, 11, 13], zero: [4] })],
  }),
  'trace-order.sgy': build({
    ...good, nSamples: 30,
    traces: Array.from({ length: 10 }, (_, i) => ({ record: 0, channel: 0, receiverXcm: 0, sourceXcm: 0, offsetM: 0, values: Array.from({ length: 30 }, (_, s) => value(i, s)) })),
  }),
  'contradictory-interval.sgy': build({ ...good, traces: good.traces.map((t) => ({ ...t, intervalUs: 4000 })) }),
  'zero-traces.sgy': build({ ...good, traces: [] }),
};
files['truncated.sgy'] = files['good.sgy'].slice(0, files['good.sgy'].length - 100);
{
  // Declares 60000 samples per trace in the binary header and in every trace header.
  const b = files['good.sgy'].slice();
  new DataView(b.buffer).setUint16(3220, 60000, false);
  for (let p = 3600; p < b.length; p += 240 + N * 4) new DataView(b.buffer).setUint16(p + 114, 60000, false);
  files['wrong-count.sgy'] = b;
}
{
  const b = files['good.sgy'].slice();
  new DataView(b.buffer).setInt16(3224, 13, false);
  files['unknown-format.sgy'] = b;
}
{
  const b = files['good.sgy'].slice();
  new DataView(b.buffer).setFloat32(3600 + 3 * (240 + N * 4) + 240 + 7 * 4, Number.NaN, false); // trace 3, sample 7
  files['nan-sample.sgy'] = b;
}
{
  // Variable-length traces: the second trace is 10 samples shorter.
  const a = build({ ...good, traces: good.traces.slice(0, 1) });
  const short = build({ ...good, nSamples: N - 10, traces: [{ ...good.traces[1], values: good.traces[1].values.slice(0, N - 10) }] });
  const c = build({ ...good, traces: good.traces.slice(2, 4) });
  files['variable-length.sgy'] = new Uint8Array([...a, ...short.subarray(3600), ...c.subarray(3600)]);
}
for (const [name, bytes] of Object.entries(files)) writeFileSync(join(dir, name), bytes);
process.stdout.write(`wrote ${Object.keys(files).length} fixtures to ${dir}\n`);
