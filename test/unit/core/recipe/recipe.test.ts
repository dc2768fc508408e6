import { describe, expect, it } from 'vitest';
import { badTracesForGather, editsForGather, makeRecipe, parseRecipe, validateRecipe } from '../../../../core/recipe/recipe';
import { isInputFileError } from '../../../../core/problems';

function codeOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (isInputFileError(e)) return `${e.problem.code} ${e.problem.field ?? ''}`.trim();
    throw e;
  }
  return 'no error';
}

const brush = { kind: 'brush', mode: 'set', slopeSamplesPerTrace: 0.8, points: [{ trace: 10, sample: 200 }], radiusTraces: 3, radiusSamples: 20, softness: 0.5 };

describe('recipe files', () => {
  it('round-trips a full recipe through JSON', () => {
    const r = makeRecipe({
      gatherKey: 'record', spacingM: 12.5, factor: 2,
      fill: { solver: 'net', lsq: { order: 2, maxIterations: 200 }, net: { width: 32, depth: 2, steps: 400, lambda: 'auto', seed: 7, timeBudgetSeconds: 60 }, holdout: true, secondPass: false },
      slopes: { method: 'pwd', radiusTimeSamples: 8, radiusTraces: 3, order: 1 },
      edits: [brush as never],
      gathers: { '1012': { badTraces: [3, 17], edits: [{ kind: 'link', from: { trace: 4, sample: 100 }, to: { trace: 20, sample: 140 } }] } },
    });
    const back = parseRecipe(JSON.stringify(r), 'a.json');
    expect(back).toEqual(r);
    expect(editsForGather(back, 1012)).toHaveLength(2);
    expect(editsForGather(back, 5)).toHaveLength(1);
    expect(badTracesForGather(back, 1012)).toEqual([3, 17]);
    expect(badTracesForGather(back, 5)).toEqual([]);
  });

  it('refuses broken recipes with coded problems naming the field', () => {
    const ok = makeRecipe({});
    expect(codeOf(() => parseRecipe('{ nope', 'r.json'))).toBe('input.bad-recipe (file)');
    expect(codeOf(() => validateRecipe([]))).toBe('input.bad-recipe (top level)');
    expect(codeOf(() => validateRecipe({ ...ok, format: 'other' }))).toBe('input.bad-recipe format');
    expect(codeOf(() => validateRecipe({ ...ok, version: 2 }))).toBe('input.bad-recipe version');
    expect(codeOf(() => validateRecipe({ ...ok, fill: { solver: 'magic' } }))).toBe('input.bad-recipe fill.solver');
    expect(codeOf(() => validateRecipe({ ...ok, fill: { lsq: { order: 3 } } }))).toBe('input.bad-recipe fill.lsq.order');
    expect(codeOf(() => validateRecipe({ ...ok, fill: { net: { width: 1.5 } } }))).toBe('input.bad-recipe fill.net.width');
    expect(codeOf(() => validateRecipe({ ...ok, slopes: { radiusTraces: -1 } }))).toBe('input.bad-recipe slopes.radiusTraces');
    expect(codeOf(() => validateRecipe({ ...ok, slopes: { edits: [] } }))).toBe('input.bad-recipe slopes.edits');
    expect(codeOf(() => validateRecipe({ ...ok, spacingM: 0 }))).toBe('input.bad-recipe recipe.spacingM');
    expect(codeOf(() => validateRecipe({ ...ok, typo: 1 }))).toBe('input.bad-recipe recipe.typo');
    expect(codeOf(() => validateRecipe({ ...ok, gathers: { abc: {} } }))).toBe('input.bad-recipe gathers.abc');
    expect(codeOf(() => validateRecipe({ ...ok, gathers: { '1': { badTraces: [-1] } } }))).toBe('input.bad-recipe gathers.1.badTraces');
    expect(codeOf(() => validateRecipe({ ...ok, edits: [{ kind: 'brush' }] }))).toMatch(/^input.bad-dips/);
  });
});
