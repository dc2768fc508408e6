/**
 * Gathers: an index of a file's traces by one header key, built from one pass over the trace headers
 * (read in large batches, never one read per trace), and one gather read into a trace-major Float32Array
 * (layout: core/grid/gather.ts, data[trace * nSamples + sample]).
 */
import { throwIfCancelled, type CancelToken } from '../problems';
import { TRACE_HEADER, TRACE_HEADER_BYTES, type TraceFieldName } from './fields';
import { decodeSamplesUnchecked } from './formats';
import { ibmBitsToFloat64 } from './ibm';
import type { SegyFile } from './open';
import { segyError } from './problem';
import { parseTraceHeader, type TraceHeader } from './trace-header';

export interface GatherKey {
  /** What the user typed or the name of the field, for messages and reports. */
  readonly label: string;
  /** 1-based byte position within the 240-byte trace header. */
  readonly byte: number;
  /** Signed integer of 2 or 4 bytes. */
  readonly sizeBytes: 2 | 4;
}

/** Named keys of our own (docs/segy.md). The standard has no receiver-station field: receivers are told apart by their X coordinate. */
export const GATHER_KEY_NAMES: Readonly<Record<string, TraceFieldName>> = {
  record: 'FIELD_RECORD',
  shot: 'FIELD_RECORD',
  ensemble: 'ENSEMBLE',
  cdp: 'ENSEMBLE',
  cmp: 'ENSEMBLE',
  receiver: 'RECEIVER_X',
  'source-point': 'SOURCE_POINT',
  inline: 'INLINE',
  crossline: 'CROSSLINE',
};

function keyFromField(label: string, name: TraceFieldName): GatherKey {
  const spec = TRACE_HEADER[name];
  if (spec.kind !== 'i16' && spec.kind !== 'i32' && spec.kind !== 'u16')
    throw new RangeError(`field ${name} is not a 2- or 4-byte integer`);
  return { label, byte: spec.byte, sizeBytes: spec.kind === 'i32' ? 4 : 2 };
}

/**
 * Parse a key given by the user: a name of ours (record, cdp, receiver, …), a trace header field name
 * (FIELD_RECORD or field-record), or a byte position "BYTE" (4-byte) / "BYTE:2" / "BYTE:4".
 */
export function parseGatherKey(text: string): GatherKey {
  const t = text.trim();
  const lower = t.toLowerCase();
  if (lower in GATHER_KEY_NAMES) return keyFromField(lower, GATHER_KEY_NAMES[lower]);
  const upper = t.toUpperCase().replace(/-/g, '_');
  if (upper in TRACE_HEADER) {
    const name = upper as TraceFieldName;
    const kind = TRACE_HEADER[name].kind;
    if (kind === 'i16' || kind === 'i32' || kind === 'u16') return keyFromField(name, name);
  }
  const m = /^(\d{1,3})(?::([24]))?$/.exec(t);
  if (m) {
    const byte = Number(m[1]);
    const sizeBytes = (m[2] ? Number(m[2]) : 4) as 2 | 4;
    if (byte >= 1 && byte + sizeBytes - 1 <= TRACE_HEADER_BYTES) return { label: `byte ${byte}${m[2] ? `:${m[2]}` : ''}`, byte, sizeBytes };
  }
  throw segyError('segy.bad-key', '(gather key)', 'the gather key is not a known name or a byte position inside the 240-byte trace header.', {
    found: text, expected: `one of ${Object.keys(GATHER_KEY_NAMES).join(', ')}, a trace header field name, or BYTE[:2|:4] with 1 ≤ BYTE ≤ 237`,
  });
}

export interface GatherEntry {
  readonly keyValue: number;
  /** 0-based trace numbers in file order. */
  readonly traceIndices: Int32Array;
}

export interface GatherIndex {
  readonly key: GatherKey;
  readonly gathers: readonly GatherEntry[];
  readonly traceCount: number;
}

export interface ReadOptions {
  readonly cancel?: CancelToken;
  /** Size of each batched read in bytes (default 8 MiB). */
  readonly batchBytes?: number;
}

const DEFAULT_BATCH_BYTES = 8 * 1024 * 1024;

function readKey(view: DataView, at: number, key: GatherKey, little: boolean): number {
  return key.sizeBytes === 4 ? view.getInt32(at + key.byte - 1, little) : view.getInt16(at + key.byte - 1, little);
}

/** One pass over all trace headers, in batches of whole traces. Gathers come in order of first appearance. */
export async function indexGathers(file: SegyFile, key: GatherKey, options: ReadOptions = {}): Promise<GatherIndex> {
  const batchTraces = Math.max(1, Math.floor((options.batchBytes ?? DEFAULT_BATCH_BYTES) / file.traceBytes));
  const little = file.byteOrder === 'little';
  const byKey = new Map<number, number[]>();
  for (let first = 0; first < file.traceCount; first += batchTraces) {
    throwIfCancelled(options.cancel);
    const n = Math.min(batchTraces, file.traceCount - first);
    // The last trace of a batch needs only its header.
    const length = (n - 1) * file.traceBytes + TRACE_HEADER_BYTES;
    const bytes = await file.source.read(file.firstTraceOffsetBytes + first * file.traceBytes, length);
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    for (let k = 0; k < n; k++) {
      const v = readKey(view, k * file.traceBytes, key, little);
      let list = byKey.get(v);
      if (!list) byKey.set(v, (list = []));
      list.push(first + k);
    }
  }
  const gathers: GatherEntry[] = [];
  for (const [keyValue, list] of byKey) gathers.push({ keyValue, traceIndices: Int32Array.from(list) });
  return { key, gathers, traceCount: file.traceCount };
}

export interface LoadedGather {
  readonly keyValue: number;
  /** 0-based trace numbers in the file, in gather order. */
  readonly traceIndices: Int32Array;
  readonly headers: readonly TraceHeader[];
  /** The raw trace headers, 240 bytes each, as in the file. */
  readonly rawHeaders: Uint8Array;
  /** The raw sample bytes, traceBytes − 240 per trace, as in the file (the writer copies them unchanged). */
  readonly rawSamples: Uint8Array;
  /** Samples, trace-major: data[trace * nSamples + sample]. */
  readonly data: Float32Array;
  readonly nTraces: number;
  readonly nSamples: number;
}

/** Read the traces `traceIndices` (ascending runs are read in batches) into a LoadedGather. */
export async function readTraces(file: SegyFile, keyValue: number, traceIndices: Int32Array, options: ReadOptions = {}): Promise<LoadedGather> {
  const nTraces = traceIndices.length;
  const nSamples = file.nSamples;
  const sampleBytes = file.traceBytes - TRACE_HEADER_BYTES;
  const little = file.byteOrder === 'little';
  const rawHeaders = new Uint8Array(nTraces * TRACE_HEADER_BYTES);
  const rawSamples = new Uint8Array(nTraces * sampleBytes);
  const data = new Float32Array(nTraces * nSamples);
  const headers: TraceHeader[] = new Array(nTraces);
  const batchTraces = Math.max(1, Math.floor((options.batchBytes ?? DEFAULT_BATCH_BYTES) / file.traceBytes));
  let k = 0;
  while (k < nTraces) {
    throwIfCancelled(options.cancel);
    const start = traceIndices[k];
    if (!(start >= 0 && start < file.traceCount)) throw new RangeError(`trace index ${start} outside 0..${file.traceCount - 1}`);
    let run = 1;
    while (k + run < nTraces && run < batchTraces && traceIndices[k + run] === start + run) run++;
    const bytes = await file.source.read(file.firstTraceOffsetBytes + start * file.traceBytes, run * file.traceBytes);
    for (let r = 0; r < run; r++, k++) {
      const at = r * file.traceBytes;
      rawHeaders.set(bytes.subarray(at, at + TRACE_HEADER_BYTES), k * TRACE_HEADER_BYTES);
      rawSamples.set(bytes.subarray(at + TRACE_HEADER_BYTES, at + file.traceBytes), k * sampleBytes);
      headers[k] = parseTraceHeader(bytes, at, little, file.lengthUnit);
      const bad = decodeSamplesUnchecked(data, k * nSamples, bytes, at + TRACE_HEADER_BYTES, nSamples, file.formatCode, little);
      if (bad >= 0) throw nonFiniteError(file, bytes, at + TRACE_HEADER_BYTES + bad * file.format.bytesPerSample, start + r, bad);
    }
  }
  return { keyValue, traceIndices, headers, rawHeaders, rawSamples, data, nTraces, nSamples };
}

function nonFiniteError(file: SegyFile, bytes: Uint8Array, at: number, trace: number, sample: number) {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const little = file.byteOrder === 'little';
  const v = file.formatCode === 1 ? ibmBitsToFloat64(view.getUint32(at, little))
    : file.formatCode === 6 ? view.getFloat64(at, little) : view.getFloat32(at, little);
  const byteOffset = file.firstTraceOffsetBytes + trace * file.traceBytes + TRACE_HEADER_BYTES + sample * file.format.bytesPerSample;
  return segyError(Number.isNaN(v) || !Number.isFinite(v) ? 'segy.non-finite-sample' : 'segy.value-out-of-range', file.name,
    Number.isNaN(v) || !Number.isFinite(v) ? `sample ${sample} is not a finite number.` : `sample ${sample} is beyond the range of 4-byte floats.`, {
      byteOffset, traceIndex: trace, found: String(v), expected: 'a finite value within ±3.4e38',
      hint: 'The samples are damaged, or the format code / byte order is wrong.',
    });
}

/** Read gather `i` of an index. */
export function readGather(file: SegyFile, index: GatherIndex, i: number, options: ReadOptions = {}): Promise<LoadedGather> {
  const g = index.gathers[i];
  if (!g) throw new RangeError(`gather ${i} outside 0..${index.gathers.length - 1}`);
  return readTraces(file, g.keyValue, g.traceIndices, options);
}
