import { describe, expect, it } from 'vitest';
import { countToFill, detectDecimationFactor, markBad, planFault, planFill, unknownBlocks, unknownMask } from '../../../../core/fill/plan';

const present = (s: string) => Array.from(s, (c) => (c === '#' ? 1 : 0));

describe('fill plan', () => {
  it('detects regular decimation from the absent positions', () => {
    expect(detectDecimationFactor(present('#.#.#.#'))).toBe(2);
    expect(detectDecimationFactor(present('#..#..#..#'))).toBe(3);
    expect(detectDecimationFactor(present('#..#.#..#'))).toBe(1);
    expect(detectDecimationFactor(present('#######'))).toBe(1);
    expect(detectDecimationFactor(present('#...#'))).toBe(1); // one stretch is a gap, not a pattern
    expect(detectDecimationFactor(present('#.#.#.#.#.##'))).toBe(2); // an extra recorded trace at the end
    expect(detectDecimationFactor(present('#.#.#.#......#.#.#'))).toBe(2); // decimated with a gap
    expect(detectDecimationFactor(present('#.##.##.##'))).toBe(1); // as many neighbours as holes: no pattern
  });

  it('classifies decimation, gaps, isolated missing, dead and bad traces', () => {
    const plan = planFill({ nTraces: 16, present: present('##.##....####.##'), dead: present('..........#.....'), bad: [14] });
    expect(plan.factor).toBe(1);
    expect(plan.runs).toEqual([
      { firstTrace: 2, count: 1, reason: 'missing' },
      { firstTrace: 5, count: 4, reason: 'gap' },
      { firstTrace: 10, count: 1, reason: 'dead' },
      { firstTrace: 13, count: 1, reason: 'missing' },
      { firstTrace: 14, count: 1, reason: 'bad' },
    ]);
    expect(countToFill(plan)).toBe(8);
    expect(Array.from(unknownMask(plan))).toEqual(present('..#..####.#..##.').map((v) => v));
    const dec = planFill({ nTraces: 7, present: present('#..#..#') });
    expect(dec.factor).toBe(3);
    expect(dec.runs.map((r) => r.reason)).toEqual(['decimation', 'decimation']);
  });

  it('is plain JSON that survives a round trip and validates', () => {
    const plan = planFill({ nTraces: 9, present: present('#.#.#.#.#') });
    const back = JSON.parse(JSON.stringify(plan));
    expect(back).toEqual(plan);
    expect(planFault(back)).toBeNull();
    expect(planFault({ ...back, runs: [{ firstTrace: 8, count: 3, reason: 'gap' }] })).toMatch(/leaves the grid/);
    expect(planFault({ ...back, factor: 0 })).toMatch(/factor/);
    expect(planFault({ ...back, runs: [{ firstTrace: 1, count: 1, reason: 'guess' }] })).toMatch(/reason/);
  });

  it('marks and unmarks bad traces', () => {
    const p = present('#####');
    const plan = markBad(planFill({ nTraces: 5, present: p }), 2, true, p);
    expect(plan.runs).toEqual([{ firstTrace: 2, count: 1, reason: 'bad' }]);
    expect(markBad(plan, 2, false, p).runs).toEqual([]);
  });

  it('finds blocks of consecutive unknown traces', () => {
    expect(unknownBlocks(present('##..#.##.'))).toEqual([[0, 1], [4, 4], [6, 7]]);
  });
});
