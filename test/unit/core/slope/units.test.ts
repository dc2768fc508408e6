import { describe, expect, it } from 'vitest';
import { apparentVelocityMPerS, convertSlopeArray, slopeFromUnit, slopeToUnit, slopeUnitFactor } from '../../../../core/slope/units';

describe('slope units (samples per trace inside; ms/trace and s/km for people)', () => {
  // Issue 3's own worked example (physics, common practice): marine shot, 25 m groups, 4 ms sampling, direct wave in
  // water at 1500 m/s: 25/1500 s = 16.67 ms per trace = 4.17 samples per trace = 0.667 s/km (1/1.5 km/s).
  it('direct wave at 1500 m/s with 25 m groups and 4 ms sampling', () => {
    const ctx = { sampleIntervalS: 0.004, traceSpacingM: 25 };
    const sigma = 25 / 1500 / 0.004;
    expect(sigma).toBeCloseTo(4.1667, 4);
    expect(slopeToUnit(sigma, 'ms-per-trace', ctx)).toBeCloseTo(16.6667, 4);
    expect(slopeToUnit(sigma, 's-per-km', ctx)).toBeCloseTo(1 / 1.5, 12);
    expect(apparentVelocityMPerS(sigma, ctx)).toBeCloseTo(1500, 9);
  });

  it('round trips and array conversion', () => {
    const ctx = { sampleIntervalS: 0.002, traceSpacingM: 12.5 };
    for (const u of ['samples-per-trace', 'ms-per-trace', 's-per-km'] as const)
      for (const v of [-3.3, 0, 0.25, 7]) expect(slopeFromUnit(slopeToUnit(v, u, ctx), u, ctx)).toBeCloseTo(v, 12);
    const out = convertSlopeArray(new Float32Array(3), [1, 2, -1], 'ms-per-trace', ctx);
    expect(Array.from(out)).toEqual([2, 4, -2]);
    expect(slopeUnitFactor('samples-per-trace', ctx)).toBe(1);
  });

  it('refuses s/km without a spacing and a non-positive interval', () => {
    expect(() => slopeUnitFactor('s-per-km', { sampleIntervalS: 0.004 })).toThrow(RangeError);
    expect(() => slopeUnitFactor('ms-per-trace', { sampleIntervalS: 0 })).toThrow(RangeError);
  });
});
