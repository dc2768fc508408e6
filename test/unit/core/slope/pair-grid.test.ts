import { describe, expect, it } from 'vitest';
import { pairsToTraces, tracesToPairs, pairsToTracesWeightedUnchecked } from '../../../../core/slope/pair-grid';

describe('pair grid ↔ trace grid', () => {
  // A field linear in x sampled at pair positions p+½ maps to its exact values at trace positions x (interior),
  // because the mean of f(x−½) and f(x+½) is f(x) for linear f (arithmetic, no source needed).
  it('is exact for fields linear in x (interior traces), constant at the ends', () => {
    const nT = 7, nS = 3;
    const f = (x: number, t: number) => 0.3 * x - 0.1 * t + 2;
    const pairs = new Float64Array((nT - 1) * nS);
    for (let p = 0; p < nT - 1; p++) for (let t = 0; t < nS; t++) pairs[p * nS + t] = f(p + 0.5, t);
    const tr = pairsToTraces(pairs, nT, nS);
    for (let x = 1; x < nT - 1; x++) for (let t = 0; t < nS; t++) expect(tr[x * nS + t]).toBeCloseTo(f(x, t), 14);
    expect(tr[0]).toBeCloseTo(f(0.5, 0), 14);
    expect(tr[(nT - 1) * nS]).toBeCloseTo(f(nT - 1.5, 0), 14);
    const back = tracesToPairs(tr, nT, nS);
    for (let p = 1; p < nT - 2; p++) for (let t = 0; t < nS; t++) expect(back[p * nS + t]).toBeCloseTo(pairs[p * nS + t], 14);
  });

  it('weighted map ignores zero-weight pairs and falls back to the mean', () => {
    const out = pairsToTracesWeightedUnchecked(new Float64Array(3), Float64Array.from([1, 5]), Float64Array.from([0, 1]), 3, 1);
    expect(Array.from(out)).toEqual([1, 5, 5]);
  });

  it('checks shapes', () => {
    expect(() => pairsToTraces(new Float64Array(5), 3, 2)).toThrow(RangeError);
    expect(() => tracesToPairs(new Float64Array(2), 1, 2)).toThrow(RangeError);
  });
});
