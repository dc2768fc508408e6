/**
 * Opening a SEG-Y file: textual, binary and extended textual headers, byte order, revision, sample format,
 * samples per trace, sample interval and trace count, all validated before anything is returned
 * (validate the whole header, then build the state). Only the headers and the first trace header are read.
 *
 * Layout (SEG-Y rev 1/2, methods.md §6.8): 3200-byte textual header, 400-byte binary header, optional
 * 3200-byte extended textual headers, then fixed-length traces (240-byte header + samples).
 */
import type { FileProblem } from '../problems';
import type { ByteSource } from './byte-source';
import {
  BINARY_HEADER, BYTE_ORDER_MAGIC, TEXT_HEADER_BYTES, TRACE_HEADER, TRACE_HEADER_BYTES,
  readFieldAt, type BinaryFieldName,
} from './fields';
import { sampleFormat, type SampleFormat, type SampleFormatCode } from './formats';
import { segyError, segyWarning } from './problem';
import { decodeText, detectTextEncoding, textCards, type TextEncoding } from './text';

export type ByteOrder = 'big' | 'little';

export interface OpenOptions {
  /** Default true: contradictions are errors. false turns recoverable ones into warnings. */
  readonly strict?: boolean;
  /** Force the byte order instead of reading/detecting it. */
  readonly byteOrder?: ByteOrder;
}

export interface SegyFile {
  readonly source: ByteSource;
  readonly name: string;
  readonly sizeBytes: number;
  readonly byteOrder: ByteOrder;
  /** How the byte order was found: the rev 2 constant, the standard's big-endian default, a guess, or the caller. */
  readonly byteOrderSource: 'constant' | 'standard' | 'guessed' | 'option';
  /** 0, 1, or 2.x (major + minor/10). */
  readonly revision: number;
  readonly textEncoding: TextEncoding;
  /** The raw 3200-byte textual header, as in the file. */
  readonly textHeader: Uint8Array;
  readonly textCards: readonly string[];
  /** Raw 3200-byte extended textual headers, in file order. */
  readonly extendedTextHeaders: readonly Uint8Array[];
  /** The raw 400-byte binary header, as in the file. */
  readonly binaryHeader: Uint8Array;
  /** Every binary header field by name, as stored (no units converted). */
  readonly binary: Readonly<Record<BinaryFieldName, number>>;
  readonly formatCode: SampleFormatCode;
  readonly format: SampleFormat;
  readonly nSamples: number;
  /** Sample interval in microseconds (may be fractional from rev 2's double field). */
  readonly sampleIntervalUs: number;
  /** Length unit of coordinates/elevations from binary 3255: 1 metres, 2 feet. */
  readonly lengthUnit: 'm' | 'ft' | 'unspecified';
  readonly firstTraceOffsetBytes: number;
  /** 240 + nSamples · bytesPerSample. */
  readonly traceBytes: number;
  readonly traceCount: number;
  readonly warnings: readonly FileProblem[];
}

const END_TEXT_STANZA = /\(\(\s*SEG\s*:\s*ENDTEXT\s*\)\)/i;
/** Largest believable sample interval: 1 s per sample (common practice, no source). */
const MAX_SAMPLE_INTERVAL_US = 1_000_000;
/** Cap on extended textual headers scanned when the count is −1 (variable). */
const MAX_EXTENDED_SCAN = 1000;

function readBinary(bytes: Uint8Array, little: boolean): Record<BinaryFieldName, number> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out = {} as Record<BinaryFieldName, number>;
  for (const [name, spec] of Object.entries(BINARY_HEADER) as [BinaryFieldName, (typeof BINARY_HEADER)[BinaryFieldName]][])
    out[name] = readFieldAt(view, spec.byte - 3201, spec.kind, little);
  return out;
}

/** How believable a binary header is in one byte order (higher is better). */
function sanity(b: Record<BinaryFieldName, number>, sizeBytes: number): number {
  let score = 0;
  const f = sampleFormat(b.SAMPLE_FORMAT_CODE);
  if (f) score += 4;
  if (b.SAMPLE_INTERVAL_US > 0 && b.SAMPLE_INTERVAL_US <= 65535) score += 1;
  if (b.SAMPLES_PER_TRACE > 0) score += 1;
  if (f && b.SAMPLES_PER_TRACE > 0) {
    const traceBytes = TRACE_HEADER_BYTES + b.SAMPLES_PER_TRACE * f.bytesPerSample;
    if ((sizeBytes - 3600) % traceBytes === 0) score += 2;
  }
  return score;
}

/** 0-based file offset of a binary header field (for messages). */
function fieldOffset(name: BinaryFieldName): number {
  return BINARY_HEADER[name].byte - 1;
}

export async function openSegy(source: ByteSource, options: OpenOptions = {}): Promise<SegyFile> {
  const strict = options.strict ?? true;
  const name = source.name;
  const sizeBytes = source.sizeBytes;
  const warnings: FileProblem[] = [];
  if (sizeBytes < 3600)
    throw segyError('segy.file-too-small', name, 'the file is too small to hold the SEG-Y headers.', {
      byteOffset: 0, found: `${sizeBytes} bytes`, expected: 'at least 3600 bytes (3200-byte textual + 400-byte binary header)',
      hint: 'This is not a SEG-Y file, or it was cut short.',
    });
  const head = await source.read(0, 3600);
  const textHeader = head.slice(0, TEXT_HEADER_BYTES);
  const binaryHeader = head.slice(TEXT_HEADER_BYTES, 3600);
  const textEncoding = detectTextEncoding(textHeader);

  // Byte order: rev 2 constant first, then header sanity.
  const bigBin = readBinary(binaryHeader, false);
  const littleBin = readBinary(binaryHeader, true);
  let byteOrder: ByteOrder;
  let byteOrderSource: SegyFile['byteOrderSource'];
  if (options.byteOrder) {
    byteOrder = options.byteOrder;
    byteOrderSource = 'option';
  } else if (bigBin.BYTE_ORDER_CONSTANT === BYTE_ORDER_MAGIC) {
    byteOrder = 'big';
    byteOrderSource = 'constant';
  } else if (littleBin.BYTE_ORDER_CONSTANT === BYTE_ORDER_MAGIC) {
    byteOrder = 'little';
    byteOrderSource = 'constant';
  } else {
    const sb = sanity(bigBin, sizeBytes);
    const sl = sanity(littleBin, sizeBytes);
    if (sl > sb) {
      byteOrder = 'little';
      byteOrderSource = 'guessed';
      warnings.push(segyWarning('segy.byte-order-guessed', name, 'the file has no byte-order constant; its binary header only makes sense read little-endian, so it is read that way.', {
        byteOffset: fieldOffset('BYTE_ORDER_CONSTANT'), found: bigBin.BYTE_ORDER_CONSTANT, expected: `${BYTE_ORDER_MAGIC} (0x01020304) or 0 for big-endian`,
        hint: 'Check a few samples; force the byte order if the guess is wrong.',
      }));
    } else {
      byteOrder = 'big';
      byteOrderSource = 'standard';
      if (sb === sl && sl < 8)
        warnings.push(segyWarning('segy.byte-order-guessed', name, 'the binary header is doubtful in both byte orders; reading big-endian as the standard prescribes.', {
          byteOffset: fieldOffset('SAMPLE_FORMAT_CODE'), found: bigBin.SAMPLE_FORMAT_CODE,
        }));
    }
  }
  const little = byteOrder === 'little';
  const binary = little ? littleBin : bigBin;

  // Revision: bytes 3501 (major) and 3502 (minor) are single bytes in rev 2, 0x0100 as a 16-bit word in rev 1.
  let major = binaryHeader[fieldOffset('REVISION_MAJOR') - TEXT_HEADER_BYTES];
  let minor = binaryHeader[fieldOffset('REVISION_MINOR') - TEXT_HEADER_BYTES];
  if (major === 0 && (minor === 1 || minor === 2)) {
    // A 16-bit revision written as the number 1 or 2 instead of 0x0100 / 0x0200 (common practice, no source).
    major = minor;
    minor = 0;
  }
  if (major > 2) {
    warnings.push(segyWarning('segy.header-contradiction', name, 'the revision field holds an unknown revision; the file is read as revision 1.', {
      byteOffset: fieldOffset('REVISION_MAJOR'), found: `${major}.${minor}`, expected: '0, 1 or 2.x',
    }));
    major = 1;
    minor = 0;
  }
  const revision = major === 2 ? 2 + Math.min(minor, 9) / 10 : major;

  // Sample format.
  const formatCodeRaw = binary.SAMPLE_FORMAT_CODE;
  const format = sampleFormat(formatCodeRaw);
  if (!format)
    throw segyError('segy.format-code', name, formatCodeRaw === 4
      ? 'sample format 4 (fixed point with gain) is obsolete and not read by Dipweave.'
      : 'the data sample format code is unknown.', {
      byteOffset: fieldOffset('SAMPLE_FORMAT_CODE'), field: 'binary header 3225–3226', found: formatCodeRaw,
      expected: '1, 2, 3, 5, 8 (rev 1) or 6, 7, 9, 10, 11, 12, 15, 16 (rev 2)',
      hint: byteOrderSource === 'option' ? 'The byte order you forced may be wrong.' : 'The file may be damaged, or not SEG-Y.',
    });

  // Where the traces start: extended textual headers (rev >= 1), or rev 2's explicit offset.
  const extendedTextHeaders: Uint8Array[] = [];
  let dataStart = 3600;
  if (major >= 1) {
    if (major >= 2 && binary.MAX_ADDITIONAL_TRACE_HEADERS > 0)
      throw segyError('segy.extended-headers', name, 'the file declares additional 240-byte trace headers, which Dipweave does not read.', {
        byteOffset: fieldOffset('MAX_ADDITIONAL_TRACE_HEADERS'), found: binary.MAX_ADDITIONAL_TRACE_HEADERS, expected: '0',
        hint: 'Rewrite the file without trace header extensions.',
      });
    const count = binary.EXTENDED_TEXT_HEADER_COUNT;
    if (count === -1) {
      let found = false;
      for (let k = 0; k < MAX_EXTENDED_SCAN && dataStart + TEXT_HEADER_BYTES <= sizeBytes; k++) {
        const block = await source.read(dataStart, TEXT_HEADER_BYTES);
        extendedTextHeaders.push(block);
        dataStart += TEXT_HEADER_BYTES;
        if (END_TEXT_STANZA.test(decodeText(block, textEncoding))) { found = true; break; }
      }
      if (!found)
        throw segyError('segy.extended-headers', name, 'the number of extended textual headers is variable (−1) but no end stanza "((SEG: EndText))" was found.', {
          byteOffset: fieldOffset('EXTENDED_TEXT_HEADER_COUNT'), found: -1, expected: 'an extended header containing ((SEG: EndText))',
        });
    } else if (count < -1 || 3600 + count * TEXT_HEADER_BYTES > sizeBytes) {
      throw segyError('segy.extended-headers', name, 'the number of extended textual headers is impossible for this file.', {
        byteOffset: fieldOffset('EXTENDED_TEXT_HEADER_COUNT'), found: count, expected: `−1 … ${Math.floor((sizeBytes - 3600) / TEXT_HEADER_BYTES)}`,
        hint: 'The binary header may be damaged, or the file is revision 0 with junk in bytes 3501–3506.',
      });
    } else {
      for (let k = 0; k < count; k++) extendedTextHeaders.push(await source.read(3600 + k * TEXT_HEADER_BYTES, TEXT_HEADER_BYTES));
      dataStart = 3600 + count * TEXT_HEADER_BYTES;
    }
    if (major >= 2 && binary.FIRST_TRACE_OFFSET_BYTES > 0) {
      const off = binary.FIRST_TRACE_OFFSET_BYTES;
      if (off < 3600 || off > sizeBytes)
        throw segyError('segy.header-contradiction', name, 'the byte offset of the first trace lies outside the file.', {
          byteOffset: fieldOffset('FIRST_TRACE_OFFSET_BYTES'), found: off, expected: `3600 … ${sizeBytes}`,
        });
      dataStart = off;
    }
  }
  let dataEnd = sizeBytes;
  if (major >= 2 && binary.TRAILER_STANZA_COUNT > 0) dataEnd = Math.max(dataStart, sizeBytes - binary.TRAILER_STANZA_COUNT * TEXT_HEADER_BYTES);
  const dataBytes = dataEnd - dataStart;
  if (dataBytes === 0)
    throw segyError('segy.zero-traces', name, 'the file holds headers but no traces.', {
      byteOffset: dataStart, found: '0 traces', expected: 'at least one trace', hint: 'The export that made this file may have failed.',
    });

  // First trace header: its sample count and interval are checked against the binary header.
  let firstCount = 0;
  let firstDt = 0;
  if (dataBytes >= TRACE_HEADER_BYTES) {
    const th = await source.read(dataStart, TRACE_HEADER_BYTES);
    const v = new DataView(th.buffer, th.byteOffset, th.byteLength);
    firstCount = readFieldAt(v, TRACE_HEADER.SAMPLES_IN_TRACE.byte - 1, 'u16', little);
    firstDt = readFieldAt(v, TRACE_HEADER.SAMPLE_INTERVAL_US.byte - 1, 'i16', little);
  }
  const bps = format.bytesPerSample;
  const divides = (n: number) => n > 0 && dataBytes % (TRACE_HEADER_BYTES + n * bps) === 0;

  // Samples per trace.
  let binCount = binary.SAMPLES_PER_TRACE;
  if (major >= 2 && binary.EXT_SAMPLES_PER_TRACE > 0 && (binCount === 0 || binCount === 65535 || divides(binary.EXT_SAMPLES_PER_TRACE)))
    binCount = binary.EXT_SAMPLES_PER_TRACE;
  let nSamples: number;
  const countOffset = fieldOffset('SAMPLES_PER_TRACE');
  if (binCount === 0 && firstCount === 0)
    throw segyError('segy.samples-per-trace', name, 'neither the binary header nor the first trace header gives the number of samples per trace.', {
      byteOffset: countOffset, found: 0, expected: 'a positive sample count', hint: 'The file is damaged or not SEG-Y.',
    });
  if (binCount === 0) {
    nSamples = firstCount;
    warnings.push(segyWarning('segy.header-contradiction', name, 'the binary header gives no sample count; the first trace header\'s count is used.', {
      byteOffset: countOffset, found: 0, expected: `${firstCount} (from trace header byte 115)`,
    }));
  } else if (firstCount === 0 || firstCount === binCount || !divides(firstCount)) {
    nSamples = binCount;
    if (firstCount !== 0 && firstCount !== binCount)
      warnings.push(segyWarning('segy.header-contradiction', name, 'the first trace header\'s sample count disagrees with the binary header, whose count fits the file size and is used.', {
        byteOffset: dataStart + TRACE_HEADER.SAMPLES_IN_TRACE.byte - 1, found: firstCount, expected: `${binCount} (binary header 3221)`,
      }));
  } else if (!divides(binCount)) {
    nSamples = firstCount;
    warnings.push(segyWarning('segy.header-contradiction', name, 'the binary header\'s sample count does not fit the file size; the first trace header\'s count does and is used.', {
      byteOffset: countOffset, found: binCount, expected: `${firstCount} (from trace header byte 115)`,
    }));
  } else {
    if (strict)
      throw segyError('segy.header-contradiction', name, 'the binary header and the first trace header give different sample counts, and both fit the file size.', {
        byteOffset: countOffset, field: 'samples per trace', found: `${binCount} (binary 3221) vs ${firstCount} (trace byte 115)`,
        expected: 'the same count in both', hint: 'Open with strict=false to use the binary header\'s count.',
      });
    nSamples = binCount;
    warnings.push(segyWarning('segy.header-contradiction', name, 'sample counts disagree; the binary header\'s is used.', {
      byteOffset: countOffset, found: `${binCount} vs ${firstCount}`,
    }));
  }
  const traceBytes = TRACE_HEADER_BYTES + nSamples * bps;
  if (traceBytes > dataBytes)
    throw segyError('segy.samples-per-trace', name, 'one trace of the declared length would not fit in the file.', {
      byteOffset: countOffset, field: 'samples per trace', found: nSamples,
      expected: `at most ${Math.floor((dataBytes - TRACE_HEADER_BYTES) / bps)} samples (${dataBytes} bytes after the headers)`,
      hint: 'The sample count in the binary header is probably wrong, or the file is truncated.',
    });

  // Sample interval.
  let binDt = binary.SAMPLE_INTERVAL_US;
  if (major >= 2 && Number.isFinite(binary.EXT_SAMPLE_INTERVAL) && binary.EXT_SAMPLE_INTERVAL > 0 && binDt <= 0) binDt = binary.EXT_SAMPLE_INTERVAL;
  const dtOffset = fieldOffset('SAMPLE_INTERVAL_US');
  let sampleIntervalUs: number;
  if (binDt < 0 || firstDt < 0 || binDt > MAX_SAMPLE_INTERVAL_US)
    throw segyError('segy.sample-interval', name, 'the sample interval is impossible.', {
      byteOffset: binDt < 0 || binDt > MAX_SAMPLE_INTERVAL_US ? dtOffset : dataStart + TRACE_HEADER.SAMPLE_INTERVAL_US.byte - 1,
      found: binDt < 0 || binDt > MAX_SAMPLE_INTERVAL_US ? binDt : firstDt,
      expected: `1 … ${MAX_SAMPLE_INTERVAL_US} microseconds`, hint: 'The header is damaged, or the byte order is wrong.',
    });
  if (binDt === 0 && firstDt === 0) {
    if (strict)
      throw segyError('segy.sample-interval', name, 'no sample interval is given in the binary header (3217) or the first trace header (117).', {
        byteOffset: dtOffset, found: 0, expected: 'a positive interval in microseconds', hint: 'Open with strict=false to read the file without a time axis.',
      });
    sampleIntervalUs = Number.NaN;
    warnings.push(segyWarning('segy.sample-interval', name, 'no sample interval given; times are unknown.', { byteOffset: dtOffset, found: 0 }));
  } else if (binDt === 0 || firstDt === 0 || binDt === firstDt) {
    sampleIntervalUs = binDt || firstDt;
  } else {
    if (strict)
      throw segyError('segy.header-contradiction', name, 'the binary header and the first trace header give different sample intervals.', {
        byteOffset: dtOffset, field: 'sample interval', found: `${binDt} µs (binary 3217) vs ${firstDt} µs (trace byte 117)`,
        expected: 'the same interval in both', hint: 'Open with strict=false to use the binary header\'s interval.',
      });
    sampleIntervalUs = binDt;
    warnings.push(segyWarning('segy.header-contradiction', name, 'sample intervals disagree; the binary header\'s is used.', {
      byteOffset: dtOffset, found: `${binDt} vs ${firstDt}`,
    }));
  }

  // Trace count: the remaining bytes must divide into whole traces.
  const traceCount = Math.floor(dataBytes / traceBytes);
  if (dataBytes % traceBytes !== 0) {
    const variable = await looksVariableLength(source, dataStart, dataEnd, bps, little);
    if (variable)
      throw segyError('segy.variable-length-traces', name, 'the traces have different lengths (their headers give different sample counts), which Dipweave does not read.', {
        byteOffset: dataStart + TRACE_HEADER.SAMPLES_IN_TRACE.byte - 1, found: variable, expected: 'one sample count for every trace',
        hint: 'Resample or pad the traces to one length first.',
      });
    const problem = {
      byteOffset: dataStart, found: `${dataBytes} bytes of traces`,
      expected: `a whole number of ${traceBytes}-byte traces (240-byte header + ${nSamples} samples × ${bps} bytes)`,
      hint: `The samples-per-trace field (found ${nSamples}) or the format code (${format.code}) may be wrong, or the file is truncated (last trace has ${dataBytes % traceBytes} of ${traceBytes} bytes).`,
    };
    // When the first trace header confirms the binary header's sample count, the layout is self-consistent
    // and the only explanation left is a file cut short.
    const truncated = firstCount === nSamples;
    if (strict)
      throw truncated
        ? segyError('segy.truncated', name, `the last trace is incomplete: the file ends ${traceBytes - (dataBytes % traceBytes)} bytes early.`, { ...problem, byteOffset: dataEnd })
        : segyError('segy.trace-size-mismatch', name, 'the trace data does not divide into whole traces.', problem);
    warnings.push(segyWarning('segy.trace-size-mismatch', name, 'the last, incomplete trace is ignored.', problem));
  }
  if (traceCount === 0)
    throw segyError('segy.zero-traces', name, 'the file holds no complete trace.', { byteOffset: dataStart, found: `${dataBytes} bytes`, expected: `at least ${traceBytes} bytes` });
  if (major >= 2 && binary.NUMBER_OF_TRACES > 0 && binary.NUMBER_OF_TRACES !== traceCount)
    warnings.push(segyWarning('segy.header-contradiction', name, 'the binary header\'s number of traces disagrees with the file size; the file size is trusted.', {
      byteOffset: fieldOffset('NUMBER_OF_TRACES'), found: binary.NUMBER_OF_TRACES, expected: `${traceCount}`,
    }));

  const ms = binary.MEASUREMENT_SYSTEM;
  return {
    source, name, sizeBytes, byteOrder, byteOrderSource, revision, textEncoding, textHeader,
    textCards: textCards(textHeader, textEncoding), extendedTextHeaders, binaryHeader, binary,
    formatCode: format.code, format, nSamples, sampleIntervalUs,
    lengthUnit: ms === 1 ? 'm' : ms === 2 ? 'ft' : 'unspecified',
    firstTraceOffsetBytes: dataStart, traceBytes, traceCount, warnings,
  };
}

/** Walk up to 4 traces by their own sample counts; a description when the counts differ, else undefined. */
async function looksVariableLength(source: ByteSource, dataStart: number, dataEnd: number, bps: number, little: boolean): Promise<string | undefined> {
  const counts: number[] = [];
  let at = dataStart;
  for (let k = 0; k < 4 && at + TRACE_HEADER_BYTES <= dataEnd; k++) {
    const th = await source.read(at, TRACE_HEADER_BYTES);
    const n = readFieldAt(new DataView(th.buffer, th.byteOffset, th.byteLength), TRACE_HEADER.SAMPLES_IN_TRACE.byte - 1, 'u16', little);
    if (n === 0) return undefined;
    counts.push(n);
    at += TRACE_HEADER_BYTES + n * bps;
  }
  return new Set(counts).size > 1 ? `sample counts ${counts.join(', ')} in the first traces` : undefined;
}

