import { describe, expect, it } from 'vitest';
import { createTriangle2D, triangle2DApply, triangleAcrossUnchecked, triangleTimeUnchecked, triangleAcrossScratchLength, triangleTimeScratchLength } from '../../../../core/slope/triangle';
import { Rng } from '../../../../core/rng';

const dot = (a: Float64Array, b: Float64Array) => a.reduce((s, v, i) => s + v * b[i], 0);
const rand = (rng: Rng, n: number) => new Float64Array(n).map(() => rng.normal());

describe('triangle smoothing (Claerbout 1992; Fomel 2007 shaping)', () => {
  // Dot-product test: T is its own adjoint, boundaries included (methods.md §2.2 asks for the exact adjoint).
  it.each([[1, 1], [2, 1], [3, 4], [7, 5], [13, 9]])('dot-product test <Tx, y> = <x, Ty> to 1e-13 (radii t=%s, x=%s)', (rt, rx) => {
    const rng = new Rng(rt * 31 + rx);
    const nCols = 11, nSamples = 37; // odd sizes: boundary and remainder cases
    const tri = createTriangle2D(nCols, nSamples, rt, rx);
    const x = rand(rng, nCols * nSamples), y = rand(rng, nCols * nSamples);
    const tx = triangle2DApply(tri, new Float64Array(x.length), x);
    const ty = triangle2DApply(tri, new Float64Array(y.length), y);
    const a = dot(tx, y), b = dot(x, ty);
    expect(Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b))).toBeLessThan(1e-13);
  });

  // Analytic impulse response: box ⋆ reversed box of length r = triangle with weights (r − |d|)/r² (common practice,
  // Claerbout 1992 "triangle smoothing").
  it.each([2, 3, 4, 5, 8])('impulse response is the triangle (r − |d|)/r² along time and across, also next to the edges (r = %s)', (r) => {
    const ns = 31, nc = 21;
    const x = new Float64Array(nc * ns);
    x[10 * ns + 15] = 1;
    const s = new Float64Array(Math.max(triangleTimeScratchLength(ns, r), triangleAcrossScratchLength(nc, ns, r)));
    const t = triangleTimeUnchecked(new Float64Array(x.length), x, nc, ns, r, s);
    for (let i = 0; i < ns; i++) expect(t[10 * ns + i]).toBeCloseTo(Math.max(0, r - Math.abs(i - 15)) / (r * r), 14);
    const a = triangleAcrossUnchecked(new Float64Array(x.length), x, nc, ns, r, s);
    for (let c = 0; c < nc; c++) expect(a[c * ns + 15]).toBeCloseTo(Math.max(0, r - Math.abs(c - 10)) / (r * r), 14);
    // impulses at the first column / first sample: the part of the triangle inside the grid, in place
    const e = new Float64Array(nc * ns);
    e[0 * ns + 1] = 1;
    e[1 * ns + 0] = 1;
    triangleTimeUnchecked(e, e, nc, ns, r, s);
    triangleAcrossUnchecked(e, e, nc, ns, r, s);
    const w = (d: number) => Math.max(0, r - Math.abs(d)) / (r * r);
    for (let c = 0; c < nc; c++) for (let t = 0; t < ns; t++) expect(e[c * ns + t]).toBeCloseTo(w(c) * w(t - 1) + w(c - 1) * w(t), 14);
  });

  it('radius 1 is the identity; out may alias the input; constants are kept away from the edges', () => {
    const rng = new Rng(2);
    const x = rand(rng, 6 * 40);
    const tri1 = createTriangle2D(6, 40, 1, 1);
    expect(Array.from(triangle2DApply(tri1, new Float64Array(x.length), x))).toEqual(Array.from(x));
    const tri = createTriangle2D(6, 40, 4, 2);
    const ref = triangle2DApply(tri, new Float64Array(x.length), x);
    const inPlace = x.slice();
    triangle2DApply(tri, inPlace, inPlace);
    for (let i = 0; i < x.length; i++) expect(inPlace[i]).toBeCloseTo(ref[i], 14);
    const ones = triangle2DApply(createTriangle2D(9, 40, 4, 2), new Float64Array(9 * 40), new Float64Array(9 * 40).fill(1));
    expect(ones[4 * 40 + 20]).toBeCloseTo(1, 14); // interior: weights sum to 1
    expect(ones[0]).toBeLessThan(1); // zero padding shrinks the corner
  });

  it('rejects radii below 1 or fractional', () => {
    expect(() => createTriangle2D(3, 3, 0, 1)).toThrow(RangeError);
    expect(() => createTriangle2D(3, 3, 2, 1.5)).toThrow(RangeError);
  });
});
