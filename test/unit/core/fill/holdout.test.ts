import { describe, expect, it } from 'vitest';
import { designHoldout } from '../../../../core/fill/holdout';
import { fillRmsRatio, gapRmsRatio, liftQuietFills } from '../../../../core/fill/amplitude';
import { clipWildSlopes } from '../../../../core/fill/fill-slopes';

const mask = (s: string) => Array.from(s, (c) => (c === 'x' ? 1 : 0));

describe('hold-out design', () => {
  it('hides a block as wide as the widest gap, inside recorded traces, with recorded margins', () => {
    const unknown = mask('..........xxxx..................');
    const d = designHoldout(unknown, 1);
    expect(d.kind).toBe('block');
    expect(d.hidden.length).toBe(4);
    const lo = d.hidden[0], hi = d.hidden[3];
    expect(hi - lo).toBe(3);
    for (let q = lo - 2; q <= hi + 2; q++) expect(unknown[q]).toBe(0);
    // Best supported: centred in the 18 recorded traces right of the gap (7 on each side).
    expect(lo).toBe(21);
  });

  it('shrinks the block when the gather has no room for the full width', () => {
    const d = designHoldout(mask('......xxxxxxxx......'), 1);
    expect(d.kind).toBe('block');
    expect(d.hidden.length).toBeLessThan(8);
    expect(d.hidden.length).toBe(2); // 6 recorded traces each side: 2 hidden + 2 margin each side
  });

  it('hides every k-th recorded trace of a decimated gather, never the first or last', () => {
    const unknown = mask('.x.x.x.x.x.x.x.x.');
    const d = designHoldout(unknown, 2);
    expect(d.kind).toBe('decimation');
    expect(d.hidden).toEqual([2, 6, 10, 14]);
  });

  it('hides isolated recorded traces for isolated missing ones, and nothing when nothing is missing', () => {
    const d = designHoldout(mask('.....x..........x.....'), 1);
    expect(d.kind).toBe('single');
    for (const h of d.hidden) expect([h - 1, h, h + 1].every((q) => mask('.....x..........x.....')[q] === 0)).toBe(true);
    expect(designHoldout(mask('......'), 1)).toEqual({ kind: 'none', hidden: [] });
  });
});

describe('amplitude checks', () => {
  it('gap RMS ratio compares the widest block with as many recorded traces beside it', () => {
    const nS = 4;
    // traces: 2 recorded at amplitude 2, 2 filled at amplitude 1, 2 recorded at amplitude 2
    const data = Float64Array.from([2, 2, 2, 2, 2, 2, 2, 2, 1, 1, 1, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2, 2, 2, 2]);
    expect(gapRmsRatio(data, mask('..xx..'), nS)).toBeCloseTo(0.5, 12);
    expect(fillRmsRatio(data, mask('..xx..'), nS)).toBeCloseTo(0.5, 12);
    expect(gapRmsRatio(data, mask('......'), nS)).toBeNaN();
  });

  it('clips wild slopes in quiet parts but keeps slopes where the energy is', () => {
    const nT = 3, nS = 100;
    const data = new Float64Array(nT * nS);
    for (let x = 0; x < nT; x++) for (let t = 40; t < 60; t++) data[x * nS + t] = Math.sin(t);
    const slopes = new Float64Array(2 * nS).fill(0.8);
    slopes[5] = 40; // quiet zone
    slopes[nS + 90] = -33;
    const n = clipWildSlopes(slopes, data, [0, 0, 0], nT, nS);
    expect(n).toBe(2);
    expect(slopes[5]).toBeCloseTo(1.6, 12);
    expect(slopes[nS + 90]).toBeCloseTo(-1.6, 12);
    expect(slopes[50]).toBe(0.8);
  });
});

describe('lifting quiet fills', () => {
  it('lifts a filled trace below 80 % of its neighbours to 80 %, and leaves fills within 80 % bit for bit', () => {
    const nS = 50;
    const row = (a: number) => Array.from({ length: nS }, (_, t) => a * Math.sin(t / 3));
    // recorded (amplitude 2) | filled at 1.0 (50 %) | filled at 1.7 (85 %) | recorded (2)
    const u = Float64Array.from([...row(2), ...row(1), ...row(1.7), ...row(2)]);
    const before = u.slice();
    const gain = liftQuietFills(u, [0, 1, 1, 0], 4, nS);
    expect(gain).toBeCloseTo(1.6, 12); // 0.8 · 2 / 1
    for (let t = 0; t < nS; t++) expect(u[nS + t]).toBeCloseTo(1.6 * Math.sin(t / 3), 12);
    for (let t = 0; t < nS; t++) expect(u[2 * nS + t]).toBe(before[2 * nS + t]);
    for (let t = 0; t < nS; t++) expect(u[t]).toBe(before[t]);
  });
});
