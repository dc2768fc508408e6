import { describe, expect, it } from 'vitest';
import { float64ToIbmBits, ibmBitsToFloat64, IBM_MAX, IBM_MIN_NORMAL } from '../../../../core/segy/ibm';

// Source: IBM hexadecimal floating-point, published worked example −118.625 = 0xC276A000 (methods.md §6.8).
// Further values [D] in methods.md §6.8, each recomputed by hand from value = 0.F · 16^(E−64).
const EXACT: [number, number][] = [
  [-118.625, 0xc276a000],
  [1.0, 0x41100000],
  [-1.0, 0xc1100000],
  [0.5, 0x40800000],
  [3.0, 0x41300000],
  [100.0, 0x42640000],
];

describe('IBM float', () => {
  it('decodes and encodes the worked example and exact values', () => {
    for (const [v, bits] of EXACT) {
      expect(ibmBitsToFloat64(bits)).toBe(v);
      expect(float64ToIbmBits(v, 'nearest')).toBe(bits >>> 0);
      expect(float64ToIbmBits(v, 'truncate')).toBe(bits >>> 0);
    }
  });

  it('truncates or rounds 0.1 as methods.md §6.8 lists', () => {
    expect(float64ToIbmBits(0.1, 'truncate')).toBe(0x40199999);
    expect(float64ToIbmBits(0.1, 'nearest')).toBe(0x4019999a);
    expect(float64ToIbmBits(1e-5, 'nearest')).toBe(0x3ca7c5ac);
  });

  it('handles zero, the largest and the smallest normalised magnitudes', () => {
    expect(ibmBitsToFloat64(0)).toBe(0);
    expect(float64ToIbmBits(0)).toBe(0);
    // A zero fraction is zero whatever the exponent (methods.md §6.8).
    expect(ibmBitsToFloat64(0x45000000)).toBe(0);
    expect(ibmBitsToFloat64(0x7fffffff)).toBeCloseTo(7.2370e75, -71);
    expect(ibmBitsToFloat64(0x7fffffff)).toBe(IBM_MAX);
    expect(ibmBitsToFloat64(0x00100000)).toBeCloseTo(5.3976e-79, 83);
    expect(ibmBitsToFloat64(0x00100000)).toBe(IBM_MIN_NORMAL);
    expect(float64ToIbmBits(IBM_MAX)).toBe(0x7fffffff);
    expect(float64ToIbmBits(1e80)).toBe(0x7fffffff); // clamps
    expect(float64ToIbmBits(-1e80)).toBe(0xffffffff);
    expect(float64ToIbmBits(IBM_MIN_NORMAL)).toBe(0x00100000);
    expect(float64ToIbmBits(1e-80)).toBe(0); // below the smallest normalised value
  });

  it('round-trips every Float32 that IBM can hold exactly, and rounds others to within half a unit', () => {
    // Seeded sweep over exponents: IBM→double is exact; double→IBM→double error ≤ 2^-21 relative (nearest).
    let x = 1.2345678e-30;
    while (x < 1e30) {
      for (const v of [x, -x]) {
        const back = ibmBitsToFloat64(float64ToIbmBits(v, 'nearest'));
        expect(Math.abs(back - v) / Math.abs(v)).toBeLessThanOrEqual(Math.pow(2, -21));
        const t = ibmBitsToFloat64(float64ToIbmBits(v, 'truncate'));
        expect(Math.abs(t)).toBeLessThanOrEqual(Math.abs(v));
        expect(Math.abs(t - v) / Math.abs(v)).toBeLessThan(Math.pow(2, -20));
      }
      x *= 3.7;
    }
    // Integers up to 2^21 need at most 21 significant bits: exact in IBM's 24-bit hex fraction.
    for (const v of [1, 7, 255, 4096, 65535, 2097151]) expect(ibmBitsToFloat64(float64ToIbmBits(v))).toBe(v);
  });
});
