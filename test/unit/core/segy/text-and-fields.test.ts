import { describe, expect, it } from 'vitest';
import { BINARY_HEADER, TRACE_HEADER, FIELD_SIZE } from '../../../../core/segy/fields';
import { SAMPLE_FORMATS } from '../../../../core/segy/formats';
import { decodeText, detectTextEncoding, encodeText, isFreeCard } from '../../../../core/segy/text';

describe('EBCDIC textual header', () => {
  it('encodes the code page 037 values listed in methods.md §6.8', () => {
    // [D via cp037] in methods.md §6.8.
    const b = encodeText('C 0AIJRSZaz.-,=', 'ebcdic', new Uint8Array(15));
    expect(Array.from(b)).toEqual([0xc3, 0x40, 0xf0, 0xc1, 0xc9, 0xd1, 0xd9, 0xe2, 0xe9, 0x81, 0xa9, 0x4b, 0x60, 0x6b, 0x7e]);
    const rev1 = encodeText('C39 SEG Y REV1', 'ebcdic', new Uint8Array(14));
    expect(Array.from(rev1)).toEqual([0xc3, 0xf3, 0xf9, 0x40, 0xe2, 0xc5, 0xc7, 0x40, 0xe8, 0x40, 0xd9, 0xc5, 0xe5, 0xf1]);
    expect(decodeText(rev1, 'ebcdic')).toBe('C39 SEG Y REV1');
  });

  it('tells EBCDIC from ASCII', () => {
    const text = 'C 1 CLIENT HARROWMERE SURVEY LINE 7'.padEnd(3200, ' ');
    expect(detectTextEncoding(encodeText(text, 'ebcdic', new Uint8Array(3200)))).toBe('ebcdic');
    expect(detectTextEncoding(encodeText(text, 'ascii', new Uint8Array(3200)))).toBe('ascii');
  });

  it('finds free cards', () => {
    expect(isFreeCard('C12'.padEnd(80))).toBe(true);
    expect(isFreeCard('C 7 '.padEnd(80))).toBe(true);
    expect(isFreeCard(' '.repeat(80))).toBe(true);
    expect(isFreeCard('C 7 PROCESSING: NONE'.padEnd(80))).toBe(false);
  });
});

describe('header byte positions and format codes', () => {
  it('match SEG-Y rev 1 / rev 2.0 as listed in methods.md §6.8', () => {
    // Binary header positions: methods.md §6.8 (rev 1 positions corroborated there; rev 2 additions from memory).
    const bin: [keyof typeof BINARY_HEADER, number][] = [
      ['DATA_TRACES_PER_ENSEMBLE', 3213], ['AUX_TRACES_PER_ENSEMBLE', 3215], ['SAMPLE_INTERVAL_US', 3217],
      ['ORIGINAL_SAMPLE_INTERVAL_US', 3219], ['SAMPLES_PER_TRACE', 3221], ['ORIGINAL_SAMPLES_PER_TRACE', 3223],
      ['SAMPLE_FORMAT_CODE', 3225], ['ENSEMBLE_FOLD', 3227], ['TRACE_SORTING_CODE', 3229], ['MEASUREMENT_SYSTEM', 3255],
      ['REVISION_MAJOR', 3501], ['REVISION_MINOR', 3502], ['FIXED_LENGTH_TRACE_FLAG', 3503], ['EXTENDED_TEXT_HEADER_COUNT', 3505],
      ['EXT_DATA_TRACES_PER_ENSEMBLE', 3261], ['EXT_AUX_TRACES_PER_ENSEMBLE', 3265], ['EXT_SAMPLES_PER_TRACE', 3269],
      ['EXT_SAMPLE_INTERVAL', 3273], ['EXT_ORIGINAL_SAMPLE_INTERVAL', 3281], ['EXT_ORIGINAL_SAMPLES_PER_TRACE', 3289],
      ['EXT_ENSEMBLE_FOLD', 3293], ['BYTE_ORDER_CONSTANT', 3297], ['MAX_ADDITIONAL_TRACE_HEADERS', 3507],
      ['TIME_BASIS_CODE', 3511], ['NUMBER_OF_TRACES', 3513], ['FIRST_TRACE_OFFSET_BYTES', 3521], ['TRAILER_STANZA_COUNT', 3529],
    ];
    for (const [name, byte] of bin) expect(BINARY_HEADER[name].byte, name).toBe(byte);
    // Trace header positions: methods.md §6.8 (1–88 corroborated; later ones from memory).
    const tr: [keyof typeof TRACE_HEADER, number, number][] = [
      ['TRACE_SEQUENCE_IN_LINE', 1, 4], ['TRACE_SEQUENCE_IN_FILE', 5, 4], ['FIELD_RECORD', 9, 4], ['TRACE_IN_FIELD_RECORD', 13, 4],
      ['SOURCE_POINT', 17, 4], ['ENSEMBLE', 21, 4], ['TRACE_IN_ENSEMBLE', 25, 4], ['TRACE_ID_CODE', 29, 2], ['OFFSET', 37, 4],
      ['RECEIVER_ELEVATION', 41, 4], ['SOURCE_SURFACE_ELEVATION', 45, 4], ['SOURCE_DEPTH', 49, 4], ['RECEIVER_DATUM_ELEVATION', 53, 4],
      ['SOURCE_DATUM_ELEVATION', 57, 4], ['SOURCE_WATER_DEPTH', 61, 4], ['RECEIVER_WATER_DEPTH', 65, 4], ['ELEVATION_SCALAR', 69, 2],
      ['COORDINATE_SCALAR', 71, 2], ['SOURCE_X', 73, 4], ['SOURCE_Y', 77, 4], ['RECEIVER_X', 81, 4], ['RECEIVER_Y', 85, 4],
      ['COORDINATE_UNITS', 89, 2], ['SAMPLES_IN_TRACE', 115, 2], ['SAMPLE_INTERVAL_US', 117, 2], ['ENSEMBLE_X', 181, 4],
      ['ENSEMBLE_Y', 185, 4], ['INLINE', 189, 4], ['CROSSLINE', 193, 4], ['SHOTPOINT', 197, 4], ['SHOTPOINT_SCALAR', 201, 2],
      ['TIME_SCALAR', 215, 2],
    ];
    for (const [name, byte, size] of tr) {
      expect(TRACE_HEADER[name].byte, name).toBe(byte);
      expect(FIELD_SIZE[TRACE_HEADER[name].kind], name).toBe(size);
    }
    // Fields tile the 240 bytes without overlap (own invariant).
    const used = new Uint8Array(241);
    for (const spec of Object.values(TRACE_HEADER)) {
      for (let b = spec.byte; b < spec.byte + FIELD_SIZE[spec.kind]; b++) {
        expect(used[b], `byte ${b}`).toBe(0);
        used[b] = 1;
      }
    }
    // Format codes and sizes: SEG-Y rev 1 (1, 2, 3, 5, 8) and rev 2.0 (6, 7, 9–12, 15, 16), methods.md §6.8.
    const sizes: Record<number, number> = { 1: 4, 2: 4, 3: 2, 5: 4, 6: 8, 7: 3, 8: 1, 9: 8, 10: 4, 11: 2, 12: 8, 15: 3, 16: 1 };
    expect(Object.keys(SAMPLE_FORMATS).map(Number).sort((a, b) => a - b)).toEqual(Object.keys(sizes).map(Number));
    for (const [code, size] of Object.entries(sizes)) expect(SAMPLE_FORMATS[Number(code) as 1].bytesPerSample).toBe(size);
  });
});

describe('readTraceFields', () => {
  it('agrees with the field table for every field, in both byte orders', async () => {
    const { readTraceFields } = await import('../../../../core/segy/trace-header');
    const { readFieldAt } = await import('../../../../core/segy/fields');
    const { Rng } = await import('../../../../core/rng');
    const rng = new Rng(3);
    const b = new Uint8Array(300);
    for (let i = 0; i < b.length; i++) b[i] = rng.int(0, 256);
    for (const little of [false, true]) {
      const got = readTraceFields(b, 17, little);
      const view = new DataView(b.buffer, 17, 240);
      expect(Object.keys(got)).toEqual(Object.keys(TRACE_HEADER));
      for (const [name, spec] of Object.entries(TRACE_HEADER)) expect(got[name as keyof typeof got], name).toBe(readFieldAt(view, spec.byte - 1, spec.kind, little));
    }
  });
});

describe('scalars and units', () => {
  it('applies the SEG-Y scalar rule (methods.md §6.8: 123456 with −100 → 1234.56, with +10 → 1234560, 0 → 1)', async () => {
    const { applyScalar, parseTraceHeader } = await import('../../../../core/segy/trace-header');
    expect(applyScalar(123456, -100)).toBeCloseTo(1234.56, 10);
    expect(applyScalar(123456, 10)).toBe(1234560);
    expect(applyScalar(123456, 0)).toBe(123456);
    expect(applyScalar(123456, 1)).toBe(123456);
    expect(applyScalar(123456, -1)).toBe(123456);
    // Elevations use 69–70, coordinates 71–72; lengths in feet become metres (0.3048 m/ft, exact by definition).
    const b = new Uint8Array(240);
    const v = new DataView(b.buffer);
    v.setInt32(40, 1000); // receiver elevation
    v.setInt16(68, 10); // elevation scalar ×10
    v.setInt16(70, -10); // coordinate scalar ÷10
    v.setInt32(80, 12345); // receiver X
    v.setInt32(36, 100); // offset: not scaled
    const m = parseTraceHeader(b, 0, false, 'm');
    expect([m.receiverElevationM, m.receiverX, m.offsetM]).toEqual([10000, 1234.5, 100]);
    const ft = parseTraceHeader(b, 0, false, 'ft');
    expect(ft.receiverElevationM).toBeCloseTo(3048, 9);
    expect(ft.receiverX).toBeCloseTo(1234.5 * 0.3048, 9);
    expect(ft.offsetM).toBeCloseTo(30.48, 12);
  });
});
