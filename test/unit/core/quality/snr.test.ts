import { describe, expect, it } from 'vitest';
import { snrDb } from '../../../../core/quality/snr';

// SNR arithmetic checks from methods.md §6.7 (d_rec = 0 → 0 dB; d/2 → 6.02 dB; 0.9 d → 20 dB; d → +∞).
describe('snrDb (methods.md §6.7)', () => {
  const d = Float64Array.from({ length: 40 }, (_, i) => Math.sin(i * 0.7) + 0.1);
  it('zero estimate gives 0 dB', () => expect(snrDb(d, new Float64Array(40), null, 10)).toBeCloseTo(0, 12));
  it('half amplitude gives 6.02 dB', () => expect(snrDb(d, d.map((v) => v / 2), null, 10)).toBeCloseTo(6.0206, 3));
  it('0.9 amplitude gives 20 dB', () => expect(snrDb(d, d.map((v) => 0.9 * v), null, 10)).toBeCloseTo(20, 10));
  it('exact gives +Infinity', () => expect(snrDb(d, d, null, 10)).toBe(Number.POSITIVE_INFINITY));
  it('scores only the listed traces', () => {
    const e = d.slice();
    for (let t = 0; t < 10; t++) e[10 + t] = 0; // trace 1 wrong
    expect(snrDb(d, e, [0, 2], 10)).toBe(Number.POSITIVE_INFINITY);
    expect(snrDb(d, e, [1], 10)).toBeCloseTo(0, 12);
  });
});
