import { describe, expect, it } from 'vitest';
import { maxflatCoefficients, maxflatDerivatives, type PwdOrder } from '../../../../core/pwd/maxflat';
import { Rng } from '../../../../core/rng';

const coefs = (s: number, n: PwdOrder) => Array.from(maxflatCoefficients(new Float64Array(2 * n + 1), s, n));
const derivs = (s: number, n: PwdOrder) => Array.from(maxflatDerivatives(new Float64Array(2 * n + 1), s, n));

function expectClose(found: number[], expected: number[], tol = 1e-15) {
  expect(found.length).toBe(expected.length);
  found.forEach((f, i) => expect(Math.abs(f - expected[i]), `index ${i}: found ${f}, expected ${expected[i]}`).toBeLessThanOrEqual(tol));
}

// Exact fractions from Fomel's maxflat design (Fomel 2002, Geophysics 67(6)), as tabulated in
// ../shared/docs/methods.md §6.1 (order b_-N .. b_N).
describe('maxflat coefficients against exact fractions (Fomel 2002; methods.md §6.1)', () => {
  it.each([
    [0, [1 / 6, 2 / 3, 1 / 6]],
    [0.5, [1 / 16, 5 / 8, 5 / 16]],
    [-0.5, [5 / 16, 5 / 8, 1 / 16]],
    [1, [0, 1 / 2, 1 / 2]],
    [1.5, [-1 / 48, 7 / 24, 35 / 48]],
    [2, [0, 0, 1]],
  ])('3-point, σ = %s', (s, expected) => expectClose(coefs(s, 1), expected));

  it.each([
    [0, [1 / 70, 8 / 35, 18 / 35, 8 / 35, 1 / 70]],
    [0.5, [1 / 256, 9 / 64, 63 / 128, 21 / 64, 9 / 256]],
    [1, [0, 1 / 14, 3 / 7, 3 / 7, 1 / 14]],
    [2, [0, 0, 3 / 14, 4 / 7, 3 / 14]],
  ])('5-point, σ = %s', (s, expected) => expectClose(coefs(s, 2), expected));

  it.each([
    [0, [-1 / 4, 0, 1 / 4]],
    [0.5, [-1 / 6, -1 / 6, 1 / 3]],
    [1, [-1 / 12, -1 / 3, 5 / 12]],
  ])('3-point derivative, σ = %s', (s, expected) => expectClose(derivs(s, 1), expected));

  it.each([
    [0, [-5 / 168, -4 / 21, 0, 4 / 21, 5 / 168]],
    [0.5, [-11 / 840, -89 / 560, -7 / 80, 49 / 240, 31 / 560]],
  ])('5-point derivative, σ = %s', (s, expected) => expectClose(derivs(s, 2), expected));

  it('sum to one, derivatives sum to zero, mirror symmetry b_k(−σ) = b_−k(σ), for random σ', () => {
    const rng = new Rng(7);
    for (const n of [1, 2] as PwdOrder[]) {
      for (let i = 0; i < 200; i++) {
        const s = (rng.uniform() - 0.5) * 8;
        const b = coefs(s, n);
        const m = coefs(-s, n);
        expect(Math.abs(b.reduce((a, c) => a + c, 0) - 1)).toBeLessThan(1e-12);
        expect(Math.abs(derivs(s, n).reduce((a, c) => a + c, 0))).toBeLessThan(1e-12);
        b.forEach((v, k) => expect(Math.abs(v - m[2 * n - k])).toBeLessThan(1e-12));
      }
    }
  });

  it('derivative matches central differences of the coefficients', () => {
    const rng = new Rng(11);
    for (const n of [1, 2] as PwdOrder[]) {
      for (let i = 0; i < 50; i++) {
        const s = (rng.uniform() - 0.5) * 6;
        const h = 1e-6;
        const up = coefs(s + h, n), dn = coefs(s - h, n), d = derivs(s, n);
        d.forEach((v, k) => expect(Math.abs(v - (up[k] - dn[k]) / (2 * h))).toBeLessThan(1e-7 * Math.max(1, Math.abs(v))));
      }
    }
  });
});
