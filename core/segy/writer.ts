/**
 * Encoding a SEG-Y file with filled traces (pure: bytes in, bytes out; app/host/segy-output.ts streams
 * them to a temporary file and renames it).
 *
 * What the output keeps and changes (docs/segy.md):
 * - the textual, binary and extended textual headers of the input, with a processing note written into
 *   free textual-header cards (cards carrying nothing but their "Cnn" label), or, when fewer than
 *   NOTE_MIN_CARDS are free, into one new extended textual header placed first (rev >= 1 only);
 *   the note is completed by finish(), whose patches the host applies before renaming;
 * - every original trace header and its sample bytes unchanged, except bytes 1–8 (trace sequence numbers),
 *   renumbered 1..N over the output when they were set (option renumber, default true);
 * - new traces with headers interpolated from their grid neighbours (coordinates, offset, ensemble,
 *   stations, elevations), trace ID code 1, and DIPWEAVE_FILLED_FLAG (bytes 233–234) = 1;
 * - a dead trace the caller chose to fill keeps its header, gets trace ID code 1 and the flag;
 * - the input's sample format, or 4-byte IEEE float (5) on request (binary 3225 updated).
 */
import { BugError, type FileProblem } from '../problems';
import {
  BINARY_HEADER, FILLED_FLAG_VALUE, TEXT_HEADER_BYTES, TRACE_HEADER, TRACE_HEADER_BYTES, fieldRange,
  readFieldAt, writeFieldAt, type TraceFieldName,
} from './fields';
import { encodeSamplesUnchecked, SAMPLE_FORMATS, type EncodeStats, type SampleFormatCode } from './formats';
import type { LoadedGather } from './gathers';
import type { GatherGeometry } from './geometry';
import type { IbmRounding } from './ibm';
import type { SegyFile } from './open';
import { applyScalar } from './trace-header';
import { CARD_CHARS, CARDS_PER_HEADER, encodeText, isFreeCard } from './text';

export interface WriterOptions {
  /** How the estimates were made, in words (goes into the textual note). */
  readonly method: string;
  /** 'same' (default) keeps the input's sample format; 5 writes 4-byte IEEE floats. */
  readonly formatCode?: 'same' | 5;
  /** Renumber trace sequence numbers (bytes 1–8) 1..N over the output where they were set. Default true. */
  readonly renumber?: boolean;
  /** IBM float encoding of filled samples (format 1). Default 'nearest'. */
  readonly ibmRounding?: IbmRounding;
}

/** One gather to write: the regular-grid data, which grid positions are estimates, and the originals. */
export interface OutputGather {
  readonly gather: LoadedGather;
  readonly geometry: GatherGeometry;
  /** gridCount × nSamples, trace-major (core/grid/gather.ts). Only rows flagged in `filled` are used. */
  readonly gridData: Float32Array;
  /** 1 where the grid position is written as an estimate. Missing positions left at 0 stay absent. */
  readonly filled: Uint8Array;
}

export interface BytePatch {
  readonly offsetBytes: number;
  readonly bytes: Uint8Array;
}

export interface WriterSummary {
  readonly tracesWritten: number;
  readonly filledTraces: number;
  /** 1-based output trace numbers of the filled traces. */
  readonly filledTraceNumbers: readonly number[];
  /** Filled samples clamped to an integer format's range. */
  readonly clampedSamples: number;
  readonly warnings: readonly FileProblem[];
}

/** Cards the note needs at least in the main textual header; fewer free cards push it to an extended header. */
export const NOTE_MIN_CARDS = 4;
/** Characters of note text per card: 80 minus the "Cnn " label. */
const NOTE_LINE_CHARS = CARD_CHARS - 4;

/** Split text into lines of at most `width` characters at spaces (a longer word is cut). */
function wrapWords(text: string, width: number): string[] {
  const lines: string[] = [];
  let cur = '';
  for (const word of text.split(' ')) {
    for (let w = word; w.length > 0; w = w.slice(width)) {
      const piece = w.slice(0, width);
      if (cur && cur.length + 1 + piece.length > width) { lines.push(cur); cur = piece; }
      else cur = cur ? `${cur} ${piece}` : piece;
    }
  }
  if (cur) lines.push(cur);
  return lines;
}

/** Fields interpolated linearly along the grid for a new trace (integers rounded to nearest). */
const INTERPOLATED: readonly TraceFieldName[] = [
  'TRACE_IN_FIELD_RECORD', 'SOURCE_POINT', 'ENSEMBLE', 'TRACE_IN_ENSEMBLE', 'OFFSET', 'INLINE', 'CROSSLINE', 'SHOTPOINT',
];
const ELEVATION_FIELDS: readonly TraceFieldName[] = [
  'RECEIVER_ELEVATION', 'SOURCE_SURFACE_ELEVATION', 'SOURCE_DEPTH', 'RECEIVER_DATUM_ELEVATION',
  'SOURCE_DATUM_ELEVATION', 'SOURCE_WATER_DEPTH', 'RECEIVER_WATER_DEPTH',
];
const COORDINATE_FIELDS: readonly TraceFieldName[] = ['SOURCE_X', 'SOURCE_Y', 'RECEIVER_X', 'RECEIVER_Y', 'ENSEMBLE_X', 'ENSEMBLE_Y'];

function unscale(scaled: number, scalar: number): number {
  if (scalar === 0 || scalar === 1 || scalar === -1) return scaled;
  return scalar > 0 ? scaled / scalar : scaled * -scalar;
}

type NoteSlot = { kind: 'main'; cards: number[] } | { kind: 'extended'; cards: number[] } | { kind: 'none' };

export class SegyWriter {
  readonly file: SegyFile;
  readonly outFormat: SampleFormatCode;
  private readonly little: boolean;
  private readonly options: WriterOptions;
  private readonly slot: NoteSlot;
  private readonly text: Uint8Array;
  private readonly binary: Uint8Array;
  private readonly extended: Uint8Array[];
  private written = 0;
  private readonly filledNumbers: number[] = [];
  private readonly stats: EncodeStats = { clamped: 0 };
  private readonly warnings: FileProblem[] = [];
  private headerDone = false;

  constructor(file: SegyFile, options: WriterOptions) {
    this.file = file;
    this.options = options;
    this.little = file.byteOrder === 'little';
    this.outFormat = options.formatCode === 5 ? 5 : file.formatCode;
    this.text = file.textHeader.slice();
    this.binary = file.binaryHeader.slice();
    this.extended = file.extendedTextHeaders.map((b) => b.slice());
    const free: number[] = [];
    file.textCards.forEach((c, i) => { if (isFreeCard(c)) free.push(i); });
    const rev = Math.floor(file.revision);
    if (free.length >= NOTE_MIN_CARDS) this.slot = { kind: 'main', cards: free };
    else if (rev >= 1) {
      this.slot = { kind: 'extended', cards: Array.from({ length: CARDS_PER_HEADER }, (_, i) => i) };
      this.extended.unshift(new Uint8Array(TEXT_HEADER_BYTES));
      const countField = BINARY_HEADER.EXTENDED_TEXT_HEADER_COUNT;
      const view = this.binaryView();
      const count = readFieldAt(view, countField.byte - 3201, countField.kind, this.little);
      if (count >= 0) writeFieldAt(view, countField.byte - 3201, countField.kind, count + 1, this.little);
    } else {
      this.slot = free.length ? { kind: 'main', cards: free } : { kind: 'none' };
      this.warnings.push({
        code: 'segy.header-contradiction', severity: 'warning', file: file.name,
        message: free.length
          ? `only ${free.length} free textual-header card(s) in a revision 0 file: the processing note is shortened; the trace header flag (bytes 233–234) marks every filled trace.`
          : 'no free textual-header card in a revision 0 file: no processing note was written; the trace header flag (bytes 233–234) marks every filled trace.',
      });
    }
    const view = this.binaryView();
    if (this.outFormat !== file.formatCode) writeFieldAt(view, BINARY_HEADER.SAMPLE_FORMAT_CODE.byte - 3201, 'i16', this.outFormat, this.little);
    if (rev >= 2) {
      // Traces follow the headers directly in the output, and no trailer is written.
      writeFieldAt(view, BINARY_HEADER.TRAILER_STANZA_COUNT.byte - 3201, 'i32', 0, this.little);
      if (file.binary.FIRST_TRACE_OFFSET_BYTES > 0)
        writeFieldAt(view, BINARY_HEADER.FIRST_TRACE_OFFSET_BYTES.byte - 3201, 'u64', 3600 + this.extended.length * TEXT_HEADER_BYTES, this.little);
    }
    this.writeNote(false);
  }

  private binaryView(): DataView {
    return new DataView(this.binary.buffer, this.binary.byteOffset, this.binary.byteLength);
  }

  get traceBytes(): number {
    return TRACE_HEADER_BYTES + this.file.nSamples * SAMPLE_FORMATS[this.outFormat].bytesPerSample;
  }

  /** Bytes before the first trace: textual, binary and extended textual headers (note still provisional). */
  headerBytes(): Uint8Array {
    if (this.headerDone) throw new BugError('SegyWriter.headerBytes() called twice');
    this.headerDone = true;
    const out = new Uint8Array(3600 + this.extended.length * TEXT_HEADER_BYTES);
    out.set(this.text, 0);
    out.set(this.binary, TEXT_HEADER_BYTES);
    this.extended.forEach((b, i) => out.set(b, 3600 + i * TEXT_HEADER_BYTES));
    return out;
  }

  private noteLines(final: boolean): string[] {
    const paragraphs = [
      'DIPWEAVE NOTE: FILLED TRACES ARE ESTIMATES, NOT RECORDINGS.',
      `FLAG: BYTES 233-234 OF EACH FILLED TRACE HEADER = ${FILLED_FLAG_VALUE} (TRACE ID CODE 1).`,
      `METHOD: ${this.options.method.replace(/\s+/g, ' ').trim()}`,
    ];
    if (!final) paragraphs.push('FILLED TRACE LIST: WRITING NOT COMPLETED.');
    else {
      const ranges: string[] = [];
      const nums = this.filledNumbers;
      for (let i = 0; i < nums.length; ) {
        let j = i;
        while (j + 1 < nums.length && nums[j + 1] === nums[j] + 1) j++;
        ranges.push(i === j ? `${nums[i]}` : `${nums[i]}-${nums[j]}`);
        i = j + 1;
      }
      paragraphs.push(`FILLED: ${nums.length} OF ${this.written} TRACES; OUTPUT TRACE NUMBERS (1 = FIRST):`);
      paragraphs.push(ranges.length ? ranges.join(' ') : 'NONE');
    }
    return paragraphs.flatMap((p) => wrapWords(p, NOTE_LINE_CHARS));
  }

  private writeNote(final: boolean): void {
    if (this.slot.kind === 'none') return;
    const cards = this.slot.cards;
    const target = this.slot.kind === 'main' ? this.text : this.extended[0];
    let lines = this.noteLines(final);
    if (this.slot.kind === 'extended') lines = ['((Dipweave: filled traces))', ...lines];
    if (lines.length > cards.length) {
      lines = lines.slice(0, cards.length);
      lines[cards.length - 1] = 'LIST CONTINUES: SEE THE FLAG IN TRACE BYTES 233-234.';
    }
    for (let i = 0; i < cards.length; i++) {
      const c = cards[i];
      const body = lines[i] ?? '';
      const label = this.slot.kind === 'main' ? `C${String(c + 1).padStart(2, ' ')} ` : '';
      encodeText((label + body).padEnd(CARD_CHARS, ' ').slice(0, CARD_CHARS), this.file.textEncoding, target, c * CARD_CHARS);
      if (this.slot.kind === 'main' && i >= lines.length) break; // leave the remaining free cards as they were
    }
  }

  /** Encode one gather's output traces in grid order. */
  encodeGather(out: OutputGather): Uint8Array {
    const { gather, geometry, gridData, filled } = out;
    const nSamples = this.file.nSamples;
    const { gridCount, traceOfGrid } = geometry;
    if (gather.nSamples !== nSamples || gridData.length !== gridCount * nSamples || filled.length !== gridCount)
      throw new BugError(`encodeGather: shapes disagree (gridCount ${gridCount}, nSamples ${nSamples}, gridData ${gridData.length}, filled ${filled.length})`);
    let count = 0;
    for (let k = 0; k < gridCount; k++) if (traceOfGrid[k] >= 0 || filled[k]) count++;
    const traceBytes = this.traceBytes;
    const bytes = new Uint8Array(count * traceBytes);
    const view = new DataView(bytes.buffer);
    const sameFormat = this.outFormat === this.file.formatCode;
    const inSampleBytes = this.file.traceBytes - TRACE_HEADER_BYTES;
    let o = 0;
    for (let k = 0; k < gridCount; k++) {
      const t = traceOfGrid[k];
      const isFilled = filled[k] === 1;
      if (t < 0 && !isFilled) continue;
      const at = o * traceBytes;
      if (t >= 0) bytes.set(gather.rawHeaders.subarray(t * TRACE_HEADER_BYTES, (t + 1) * TRACE_HEADER_BYTES), at);
      else this.interpolateHeader(bytes, at, gather, geometry, k);
      const seqNumber = this.written + o + 1;
      if (this.options.renumber ?? true) {
        for (const f of ['TRACE_SEQUENCE_IN_LINE', 'TRACE_SEQUENCE_IN_FILE'] as const) {
          const p = at + TRACE_HEADER[f].byte - 1;
          if (view.getInt32(p, this.little) !== 0) view.setInt32(p, seqNumber, this.little);
        }
      }
      if (isFilled) {
        view.setInt16(at + TRACE_HEADER.TRACE_ID_CODE.byte - 1, 1, this.little);
        view.setInt16(at + TRACE_HEADER.DIPWEAVE_FILLED_FLAG.byte - 1, FILLED_FLAG_VALUE, this.little);
        for (let s = 0; s < nSamples; s++) {
          const v = gridData[k * nSamples + s];
          if (!Number.isFinite(v)) throw new BugError(`filled sample ${s} at grid position ${k} is ${v}: the fill produced a non-finite value`);
        }
        encodeSamplesUnchecked(bytes, at + TRACE_HEADER_BYTES, gridData, k * nSamples, nSamples, this.outFormat, this.little, this.stats, this.options.ibmRounding);
        this.filledNumbers.push(seqNumber);
      } else if (sameFormat) {
        bytes.set(gather.rawSamples.subarray(t * inSampleBytes, (t + 1) * inSampleBytes), at + TRACE_HEADER_BYTES);
      } else {
        encodeSamplesUnchecked(bytes, at + TRACE_HEADER_BYTES, gather.data, t * nSamples, nSamples, this.outFormat, this.little, this.stats);
      }
      o++;
    }
    this.written += count;
    return bytes;
  }

  /** Header of a new trace at grid position k: nearest left original as template, listed fields interpolated. */
  private interpolateHeader(bytes: Uint8Array, at: number, gather: LoadedGather, geometry: GatherGeometry, k: number): void {
    const { traceOfGrid, gridCount } = geometry;
    let kl = k - 1;
    while (kl >= 0 && traceOfGrid[kl] < 0) kl--;
    let kr = k + 1;
    while (kr < gridCount && traceOfGrid[kr] < 0) kr++;
    const left = kl >= 0 ? traceOfGrid[kl] : -1;
    const right = kr < gridCount ? traceOfGrid[kr] : -1;
    const template = left >= 0 ? left : right;
    if (template < 0) throw new BugError('interpolateHeader: a gather without any original trace');
    bytes.set(gather.rawHeaders.subarray(template * TRACE_HEADER_BYTES, (template + 1) * TRACE_HEADER_BYTES), at);
    const view = new DataView(bytes.buffer, bytes.byteOffset + at, TRACE_HEADER_BYTES);
    view.setInt16(TRACE_HEADER.DIPWEAVE_FILLED_FLAG.byte - 1, 0, this.little);
    if (left < 0 || right < 0) return;
    const w = (k - kl) / (kr - kl);
    const hl = gather.headers[left].fields;
    const hr = gather.headers[right].fields;
    const put = (name: TraceFieldName, value: number) => {
      const spec = TRACE_HEADER[name];
      const [lo, hi] = fieldRange(spec.kind);
      writeFieldAt(view, spec.byte - 1, spec.kind, Math.min(hi, Math.max(lo, Math.round(value))), this.little);
    };
    for (const f of INTERPOLATED) put(f, hl[f] + w * (hr[f] - hl[f]));
    const scaled = (fields: typeof hl, f: TraceFieldName, scalarField: TraceFieldName) => applyScalar(fields[f], fields[scalarField]);
    for (const f of ELEVATION_FIELDS) {
      const v = scaled(hl, f, 'ELEVATION_SCALAR') + w * (scaled(hr, f, 'ELEVATION_SCALAR') - scaled(hl, f, 'ELEVATION_SCALAR'));
      put(f, unscale(v, hl.ELEVATION_SCALAR));
    }
    for (const f of COORDINATE_FIELDS) {
      const v = scaled(hl, f, 'COORDINATE_SCALAR') + w * (scaled(hr, f, 'COORDINATE_SCALAR') - scaled(hl, f, 'COORDINATE_SCALAR'));
      put(f, unscale(v, hl.COORDINATE_SCALAR));
    }
  }

  /** Complete the note and header counts. Apply the patches to the written file before it is renamed. */
  finish(): { patches: BytePatch[]; summary: WriterSummary } {
    this.writeNote(true);
    const patches: BytePatch[] = [];
    if (this.slot.kind === 'main') patches.push({ offsetBytes: 0, bytes: this.text.slice() });
    if (this.slot.kind === 'extended') patches.push({ offsetBytes: 3600, bytes: this.extended[0].slice() });
    if (Math.floor(this.file.revision) >= 2) {
      writeFieldAt(this.binaryView(), BINARY_HEADER.NUMBER_OF_TRACES.byte - 3201, 'u64', this.written, this.little);
      patches.push({ offsetBytes: TEXT_HEADER_BYTES, bytes: this.binary.slice() });
    }
    if (this.stats.clamped > 0)
      this.warnings.push({
        code: 'segy.value-out-of-range', severity: 'warning', file: this.file.name,
        message: `${this.stats.clamped} filled samples exceeded the range of the output format (${SAMPLE_FORMATS[this.outFormat].label}) and were clamped.`,
        hint: 'Write IEEE floats (format 5) to keep every value.',
      });
    return {
      patches,
      summary: {
        tracesWritten: this.written, filledTraces: this.filledNumbers.length, filledTraceNumbers: this.filledNumbers.slice(),
        clampedSamples: this.stats.clamped, warnings: this.warnings.slice(),
      },
    };
  }
}
