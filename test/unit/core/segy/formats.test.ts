import { describe, expect, it } from 'vitest';
import { Rng } from '../../../../core/rng';
import { decodeSamplesUnchecked, encodeSamplesUnchecked, SAMPLE_FORMATS, type SampleFormatCode } from '../../../../core/segy/formats';

const CODES = Object.keys(SAMPLE_FORMATS).map(Number) as SampleFormatCode[];

describe('sample codecs', () => {
  it('round-trip every format in both byte orders, with the encoded bytes in the stated order', () => {
    const rng = new Rng(7);
    for (const code of CODES) {
      const f = SAMPLE_FORMATS[code];
      const n = 37; // odd length: no accidental alignment
      const values = new Float32Array(n);
      for (let i = 0; i < n; i++) {
        const lo = Math.max(f.min, -30000), hi = Math.min(f.max, 30000);
        values[i] = f.integer ? Math.round(lo + rng.uniform() * (hi - lo)) : Math.fround(rng.normal() * 1000);
      }
      if (f.integer) { values[0] = Math.max(f.min, -8388608); values[1] = Math.min(f.max, 8388607); }
      for (const little of [false, true]) {
        const bytes = new Uint8Array(3 + n * f.bytesPerSample);
        const stats = { clamped: 0 };
        encodeSamplesUnchecked(bytes, 3, values, 0, n, code, little, stats);
        expect(stats.clamped).toBe(0);
        const back = new Float32Array(n + 2);
        expect(decodeSamplesUnchecked(back, 2, bytes, 3, n, code, little)).toBe(-1);
        for (let i = 0; i < n; i++) {
          if (code === 1) expect(Math.abs(back[i + 2] - values[i])).toBeLessThanOrEqual(Math.abs(values[i]) * 2 ** -21);
          else expect(back[i + 2], `format ${code} ${little ? 'LE' : 'BE'} sample ${i}`).toBe(values[i]);
        }
      }
    }
  });

  it('lays out bytes as the standard says (big-endian two\'s complement, 3-byte ints)', () => {
    const stats = { clamped: 0 };
    const b = new Uint8Array(3);
    encodeSamplesUnchecked(b, 0, new Float32Array([-2]), 0, 1, 7, false, stats);
    expect(Array.from(b)).toEqual([0xff, 0xff, 0xfe]);
    encodeSamplesUnchecked(b, 0, new Float32Array([0x123456]), 0, 1, 15, true, stats);
    expect(Array.from(b)).toEqual([0x56, 0x34, 0x12]);
    const e = new Uint8Array(8);
    encodeSamplesUnchecked(e, 0, new Float32Array([-3]), 0, 1, 9, false, stats);
    expect(Array.from(e)).toEqual([0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xfd]);
  });

  it('clamps and counts values outside an integer format', () => {
    const stats = { clamped: 0 };
    const b = new Uint8Array(4);
    encodeSamplesUnchecked(b, 0, new Float32Array([40000, -40000]), 0, 2, 3, false, stats);
    expect(stats.clamped).toBe(2);
    const back = new Float32Array(2);
    decodeSamplesUnchecked(back, 0, b, 0, 2, 3, false);
    expect(Array.from(back)).toEqual([32767, -32768]);
  });

  it('reports the first non-finite or out-of-Float32-range sample', () => {
    const b = new Uint8Array(12);
    const v = new DataView(b.buffer);
    v.setFloat32(4, Number.POSITIVE_INFINITY);
    v.setFloat32(8, Number.NaN);
    expect(decodeSamplesUnchecked(new Float32Array(3), 0, b, 0, 3, 5, false)).toBe(1);
    v.setUint32(0, 0x7fffffff); // IBM 7.2e75: beyond Float32
    expect(decodeSamplesUnchecked(new Float32Array(1), 0, b, 0, 1, 1, false)).toBe(0);
    const d = new Uint8Array(8);
    new DataView(d.buffer).setFloat64(0, 1e300);
    expect(decodeSamplesUnchecked(new Float32Array(1), 0, d, 0, 1, 6, false)).toBe(0);
  });
});
