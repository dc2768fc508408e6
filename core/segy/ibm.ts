/**
 * IBM System/360 single-precision hexadecimal float (SEG-Y format code 1):
 * value = (−1)^s · 0.F · 16^(E−64), 7-bit excess-64 exponent E, 24-bit fraction F, no hidden bit.
 * Source: IBM hexadecimal floating-point definition; worked example −118.625 = 0xC276A000
 * (methods.md §6.8). Decoding to Float64 is exact; encoding from a double loses up to 3 bits to hex
 * normalisation and is either truncated or rounded to nearest (ties away from zero), as the caller asks.
 */

/** 16^(e−64) / 2^24 for e = 0..127, so value = fraction24 · scale[e]. Every entry is an exact power of two. */
const IBM_SCALE = new Float64Array(128);
for (let e = 0; e < 128; e++) IBM_SCALE[e] = Math.pow(2, 4 * (e - 64) - 24);

/** Decode the 32 bits of an IBM float (as an unsigned or signed int) to a double, exactly. */
export function ibmBitsToFloat64(bits: number): number {
  const fraction = bits & 0x00ffffff;
  const v = fraction * IBM_SCALE[(bits >>> 24) & 0x7f];
  return bits & 0x80000000 ? -v : v;
}

export type IbmRounding = 'nearest' | 'truncate';

/** Largest IBM single: 0x7FFFFFFF = (1 − 16^−6) · 16^63 ≈ 7.2370e75. */
export const IBM_MAX = (1 - Math.pow(16, -6)) * Math.pow(16, 63);
/** Smallest positive normalised IBM single: 0x00100000 = 16^−65 ≈ 5.3976e−79. */
export const IBM_MIN_NORMAL = Math.pow(16, -65);

/**
 * Encode a finite double as IBM float bits (unsigned 32-bit number). Magnitudes above IBM_MAX clamp to
 * ±IBM_MAX; magnitudes below the smallest normalised value become zero (IBM has no subnormals in
 * normalised form). NaN is a caller bug: the writer checks samples before encoding.
 */
export function float64ToIbmBits(value: number, rounding: IbmRounding = 'nearest'): number {
  if (value === 0 || Number.isNaN(value)) return 0;
  const sign = value < 0 ? 0x80000000 : 0;
  const mag = Math.abs(value);
  if (mag >= IBM_MAX) return (sign | 0x7fffffff) >>> 0;
  // Exponent so that 1/16 <= mag / 16^(e−64) < 1.
  let e = Math.floor(Math.log2(mag) / 4) + 65;
  let scaled = mag / Math.pow(16, e - 64);
  if (scaled >= 1) { e++; scaled /= 16; }
  else if (scaled < 1 / 16) { e--; scaled *= 16; }
  let fraction = scaled * 16777216; // 2^24
  fraction = rounding === 'truncate' ? Math.floor(fraction) : Math.floor(fraction + 0.5);
  if (fraction >= 16777216) { fraction /= 16; e++; fraction = Math.floor(fraction); }
  if (e > 127) return (sign | 0x7fffffff) >>> 0;
  if (e < 0) return 0;
  return (sign | (e << 24) | fraction) >>> 0;
}
