/**
 * A slope (or confidence) field as a SEG-Y file beside its input: the input's binary header and every trace
 * header kept (so geometry and gather keys read the same), samples replaced by the field as 4-byte IEEE floats
 * (format 5), and a new textual header that states what the samples are and in which unit. Extended textual
 * headers are dropped (count set to 0). Pure: bytes in, bytes out (the CLI streams them to a temporary file).
 * Trace layout: one output trace per input trace, or one per grid position (positions without a recorded trace
 * get the header of their nearest recorded neighbour with DIPWEAVE_FILLED_FLAG = 1).
 */
import type { SegyFile } from '../segy/open';
import { BINARY_HEADER, TRACE_HEADER, TRACE_HEADER_BYTES, TEXT_HEADER_BYTES, FILLED_FLAG_VALUE, writeFieldAt } from '../segy/fields';
import { CARD_CHARS, CARDS_PER_HEADER, encodeText } from '../segy/text';

/** Textual header (3200 bytes, the input's encoding): 40 cards "Cnn text", the last two the standard's end cards. */
export function dipTextHeader(file: SegyFile, lines: readonly string[]): Uint8Array {
  const out = new Uint8Array(TEXT_HEADER_BYTES);
  const rev = Math.floor(file.revision);
  const cards: string[] = [];
  for (let i = 0; i < CARDS_PER_HEADER; i++) {
    const label = `C${String(i + 1).padStart(2, ' ')} `;
    let body = i < lines.length ? lines[i] : '';
    if (i === 38) body = rev >= 2 ? 'SEG-Y_REV2.0' : rev === 1 ? 'SEG Y REV1' : body;
    if (i === 39) body = 'END TEXTUAL HEADER';
    cards.push((label + body).padEnd(CARD_CHARS, ' ').slice(0, CARD_CHARS));
  }
  encodeText(cards.join(''), file.textEncoding, out, 0);
  return out;
}

/** Bytes before the first trace: the textual header above and the input's binary header, adjusted. */
export function dipFileHeaderBytes(file: SegyFile, lines: readonly string[], traceCount: number): Uint8Array {
  const out = new Uint8Array(TEXT_HEADER_BYTES + 400);
  out.set(dipTextHeader(file, lines), 0);
  const bin = file.binaryHeader.slice();
  const view = new DataView(bin.buffer, bin.byteOffset, bin.byteLength);
  const little = file.byteOrder === 'little';
  const put = (f: { byte: number; kind: Parameters<typeof writeFieldAt>[2] }, v: number) => writeFieldAt(view, f.byte - 3201, f.kind, v, little);
  put(BINARY_HEADER.SAMPLE_FORMAT_CODE, 5);
  put(BINARY_HEADER.EXTENDED_TEXT_HEADER_COUNT, 0);
  if (Math.floor(file.revision) >= 2) {
    put(BINARY_HEADER.FIRST_TRACE_OFFSET_BYTES, 0);
    put(BINARY_HEADER.TRAILER_STANZA_COUNT, 0);
    if (file.binary.NUMBER_OF_TRACES > 0) put(BINARY_HEADER.NUMBER_OF_TRACES, traceCount);
  }
  out.set(bin, TEXT_HEADER_BYTES);
  return out;
}

/**
 * Encodes output traces. headerOf[i]: index of the raw header (in rawHeaders, 240 bytes each) to copy for output
 * trace i; flagged[i] = 1 marks a trace placed at a grid position without a recording. values: nOut × nSamples.
 */
export function encodeDipTraces(
  file: SegyFile, rawHeaders: Uint8Array, headerOf: Int32Array, flagged: Uint8Array, values: Float32Array | Float64Array, nSamples: number,
): Uint8Array {
  const nOut = headerOf.length;
  const traceBytes = TRACE_HEADER_BYTES + 4 * nSamples;
  const out = new Uint8Array(nOut * traceBytes);
  const view = new DataView(out.buffer);
  const little = file.byteOrder === 'little';
  for (let i = 0; i < nOut; i++) {
    const at = i * traceBytes;
    const h = headerOf[i];
    out.set(rawHeaders.subarray(h * TRACE_HEADER_BYTES, (h + 1) * TRACE_HEADER_BYTES), at);
    view.setUint16(at + TRACE_HEADER.SAMPLES_IN_TRACE.byte - 1, nSamples, little);
    if (flagged[i]) view.setInt16(at + TRACE_HEADER.DIPWEAVE_FILLED_FLAG.byte - 1, FILLED_FLAG_VALUE, little);
    for (let s = 0; s < nSamples; s++) view.setFloat32(at + TRACE_HEADER_BYTES + 4 * s, values[i * nSamples + s], little);
  }
  return out;
}
