/**
 * Sample formats (binary header 3225–3226). Source: SEG-Y rev 1 table for codes 1–5 and 8, SEG-Y_r2.0 for
 * 6, 7, 9–12, 15, 16 (methods.md §6.8; rev 2 codes from memory). Code 4 (fixed point with gain) is obsolete
 * and refused.
 *
 * Decoders write Float32 samples into a caller buffer (trace-major gather layout, core/grid/gather.ts) and
 * return the index of the first sample that is not a finite Float32 (NaN, ±Inf, or an IBM/float64/64-bit
 * value beyond Float32 range), or −1. Encoders take Float32/Float64 values that the caller has checked.
 */
import { float64ToIbmBits, ibmBitsToFloat64, type IbmRounding } from './ibm';

export type SampleFormatCode = 1 | 2 | 3 | 5 | 6 | 7 | 8 | 9 | 10 | 11 | 12 | 15 | 16;

export interface SampleFormat {
  readonly code: SampleFormatCode;
  readonly bytesPerSample: number;
  readonly label: string;
  readonly integer: boolean;
  /** Inclusive range of an integer format (for clamping filled samples). */
  readonly min: number;
  readonly max: number;
}

const F32_MAX = 3.4028234663852886e38;
const fmt = (code: SampleFormatCode, bytesPerSample: number, label: string, integer: boolean, min: number, max: number): SampleFormat =>
  ({ code, bytesPerSample, label, integer, min, max });

export const SAMPLE_FORMATS: Readonly<Record<SampleFormatCode, SampleFormat>> = {
  1: fmt(1, 4, '4-byte IBM float', false, -F32_MAX, F32_MAX),
  2: fmt(2, 4, '4-byte signed integer', true, -2147483648, 2147483647),
  3: fmt(3, 2, '2-byte signed integer', true, -32768, 32767),
  5: fmt(5, 4, '4-byte IEEE float', false, -F32_MAX, F32_MAX),
  6: fmt(6, 8, '8-byte IEEE float', false, -F32_MAX, F32_MAX),
  7: fmt(7, 3, '3-byte signed integer', true, -8388608, 8388607),
  8: fmt(8, 1, '1-byte signed integer', true, -128, 127),
  9: fmt(9, 8, '8-byte signed integer', true, -9223372036854775808, 9223372036854775807),
  10: fmt(10, 4, '4-byte unsigned integer', true, 0, 4294967295),
  11: fmt(11, 2, '2-byte unsigned integer', true, 0, 65535),
  12: fmt(12, 8, '8-byte unsigned integer', true, 0, 18446744073709551615),
  15: fmt(15, 3, '3-byte unsigned integer', true, 0, 16777215),
  16: fmt(16, 1, '1-byte unsigned integer', true, 0, 255),
};

export function sampleFormat(code: number): SampleFormat | undefined {
  return (SAMPLE_FORMATS as Record<number, SampleFormat | undefined>)[code];
}

const TWO32 = 4294967296;
const MACHINE_LITTLE = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/**
 * Decode `nSamples` samples starting at `bytes[byteOffset]` into `out[outOffset…]`. Unchecked: the caller
 * guarantees the ranges. Returns the index (0-based within this run) of the first non-finite value, or −1.
 */
export function decodeSamplesUnchecked(
  out: Float32Array, outOffset: number, bytes: Uint8Array, byteOffset: number, nSamples: number,
  code: SampleFormatCode, little: boolean,
): number {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let p = byteOffset;
  let bad = -1;
  switch (code) {
    case 1:
      for (let i = 0; i < nSamples; i++, p += 4) {
        const bitsIbm = little
          ? bytes[p] | (bytes[p + 1] << 8) | (bytes[p + 2] << 16) | (bytes[p + 3] << 24)
          : (bytes[p] << 24) | (bytes[p + 1] << 16) | (bytes[p + 2] << 8) | bytes[p + 3];
        const v = (out[outOffset + i] = ibmBitsToFloat64(bitsIbm));
        if (bad < 0 && !(v <= F32_MAX && v >= -F32_MAX)) bad = i;
      }
      break;
    case 5: {
      // Copy the bytes into the output's memory, then swap in place when the file's byte order is not the
      // machine's: about twice as fast as DataView.getFloat32. NaN/Inf have an all-ones exponent.
      new Uint8Array(out.buffer, out.byteOffset + 4 * outOffset, 4 * nSamples).set(bytes.subarray(p, p + 4 * nSamples));
      const bits = new Uint32Array(out.buffer, out.byteOffset + 4 * outOffset, nSamples);
      if (little === MACHINE_LITTLE) {
        for (let i = 0; i < nSamples; i++) if ((bits[i] & 0x7f800000) === 0x7f800000) { bad = i; break; }
      } else {
        for (let i = 0; i < nSamples; i++) {
          const x = bits[i];
          const y = (x >>> 24) | ((x >>> 8) & 0xff00) | ((x & 0xff00) << 8) | (x << 24);
          bits[i] = y;
          if (bad < 0 && (y & 0x7f800000) === 0x7f800000) bad = i;
        }
      }
      break;
    }
    case 6:
      for (let i = 0; i < nSamples; i++, p += 8) {
        const v = (out[outOffset + i] = view.getFloat64(p, little));
        if (bad < 0 && !(v <= F32_MAX && v >= -F32_MAX)) bad = i;
      }
      break;
    case 2: for (let i = 0; i < nSamples; i++, p += 4) out[outOffset + i] = view.getInt32(p, little); break;
    case 10: for (let i = 0; i < nSamples; i++, p += 4) out[outOffset + i] = view.getUint32(p, little); break;
    case 3: for (let i = 0; i < nSamples; i++, p += 2) out[outOffset + i] = view.getInt16(p, little); break;
    case 11: for (let i = 0; i < nSamples; i++, p += 2) out[outOffset + i] = view.getUint16(p, little); break;
    case 8: for (let i = 0; i < nSamples; i++, p += 1) out[outOffset + i] = view.getInt8(p); break;
    case 16: for (let i = 0; i < nSamples; i++, p += 1) out[outOffset + i] = view.getUint8(p); break;
    case 7:
    case 15:
      for (let i = 0; i < nSamples; i++, p += 3) {
        const b0 = bytes[p], b1 = bytes[p + 1], b2 = bytes[p + 2];
        let v = little ? b0 | (b1 << 8) | (b2 << 16) : (b0 << 16) | (b1 << 8) | b2;
        if (code === 7 && v & 0x800000) v -= 0x1000000;
        out[outOffset + i] = v;
      }
      break;
    case 9:
    case 12:
      for (let i = 0; i < nSamples; i++, p += 8) {
        const a = view.getUint32(p, little), b = view.getUint32(p + 4, little);
        const hi = little ? b : a, lo = little ? a : b;
        out[outOffset + i] = code === 9 && hi & 0x80000000 ? (hi - TWO32) * TWO32 + lo : hi * TWO32 + lo;
      }
      break;
  }
  return bad;
}

export interface EncodeStats {
  /** Samples that fell outside an integer format's range and were clamped. */
  clamped: number;
}

/**
 * Encode `nSamples` values into `bytes[byteOffset…]`. Integer formats round to nearest and clamp (counted
 * in stats); IBM uses `ibmRounding`. Unchecked: values must be finite.
 */
export function encodeSamplesUnchecked(
  bytes: Uint8Array, byteOffset: number, values: Float32Array | Float64Array, valueOffset: number, nSamples: number,
  code: SampleFormatCode, little: boolean, stats: EncodeStats, ibmRounding: IbmRounding = 'nearest',
): Uint8Array {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const f = SAMPLE_FORMATS[code];
  let p = byteOffset;
  for (let i = 0; i < nSamples; i++, p += f.bytesPerSample) {
    let v = values[valueOffset + i];
    if (f.integer) {
      v = Math.round(v);
      if (v < f.min) { v = f.min; stats.clamped++; } else if (v > f.max) { v = f.max; stats.clamped++; }
    }
    switch (code) {
      case 1: view.setUint32(p, float64ToIbmBits(v, ibmRounding), little); break;
      case 5: view.setFloat32(p, v, little); break;
      case 6: view.setFloat64(p, v, little); break;
      case 2: view.setInt32(p, v, little); break;
      case 10: view.setUint32(p, v, little); break;
      case 3: view.setInt16(p, v, little); break;
      case 11: view.setUint16(p, v, little); break;
      case 8: view.setInt8(p, v); break;
      case 16: view.setUint8(p, v); break;
      case 7:
      case 15: {
        const u = v < 0 ? v + 0x1000000 : v;
        const b0 = u & 0xff, b1 = (u >> 8) & 0xff, b2 = (u >> 16) & 0xff;
        if (little) { bytes[p] = b0; bytes[p + 1] = b1; bytes[p + 2] = b2; }
        else { bytes[p] = b2; bytes[p + 1] = b1; bytes[p + 2] = b0; }
        break;
      }
      case 9:
      case 12: {
        // Filled values come from Float32 data, far inside ±2^53: split exactly into two 32-bit words.
        let hi = Math.floor(v / TWO32);
        const lo = v - hi * TWO32;
        if (hi < 0) hi += TWO32;
        view.setUint32(p, little ? lo : hi, little);
        view.setUint32(p + 4, little ? hi : lo, little);
        break;
      }
    }
  }
  return bytes;
}
