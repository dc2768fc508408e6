import { describe, expect, it } from 'vitest';
import { alignReference } from '../../../../../app/renderer/analysis/reference';
import { Rng } from '../../../../../core/rng';

// The expected shift is known by construction (the screen gather is cut from the reference).
describe('alignReference', () => {
  const nRef = 20, ns = 30;
  const rng = new Rng(11);
  const ref = Float64Array.from({ length: nRef * ns }, () => rng.normal());

  it('finds the shift of a cut-out with missing traces, with zero misfit', () => {
    const nTraces = 14, shift = 4;
    const data = ref.slice(shift * ns, (shift + nTraces) * ns);
    const present = new Uint8Array(nTraces).fill(1);
    for (let x = 5; x < 9; x++) { present[x] = 0; data.fill(0, x * ns, (x + 1) * ns); }
    const r = alignReference(data, present, nTraces, ref, nRef, ns);
    expect(r.shift).toBe(shift);
    expect(r.misfit).toBe(0);
  });

  it('reports a large misfit for unrelated data and −1 when the reference is too short', () => {
    const other = Float64Array.from({ length: 10 * ns }, () => rng.normal());
    const r = alignReference(other, new Uint8Array(10).fill(1), 10, ref, nRef, ns);
    expect(r.misfit).toBeGreaterThan(1);
    expect(alignReference(other, new Uint8Array(10).fill(1), 10, ref, 9, ns).shift).toBe(-1);
  });
});
