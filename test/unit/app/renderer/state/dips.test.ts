import { describe, expect, it } from 'vitest';
import { DipsState } from '../../../../../app/renderer/state/dips.svelte';
import { effectiveEdits } from '../../../../../app/renderer/state/dip-edit-model';
import type { SlopeResult } from '../../../../../app/renderer/workers/protocol';

const nTraces = 20;
const nSamples = 50;

function estimate(value: number): SlopeResult {
  return {
    slopePairs: new Float64Array((nTraces - 1) * nSamples).fill(value),
    slopeTraces: new Float64Array(nTraces * nSamples).fill(value),
    confidence: new Float64Array(nTraces * nSamples).fill(1),
    seconds: 0, description: '', gaps: [],
  };
}

describe('DipsState: edits kept apart from the estimate, undo/redo, restore', () => {
  it('a brush stroke sets the slope near the stroke only; undo returns the estimate exactly', () => {
    const d = new DipsState();
    d.setGather(nTraces, nSamples);
    d.setEstimate(estimate(0.5));
    d.brushMode = 'set';
    d.brushValue = -1;
    d.brushRadiusTraces = 2;
    d.brushSoftness = 0;
    d.brush([{ trace: 10, sample: 25 }], 2);
    const f = d.effectiveTraces()!;
    expect(f[10 * nSamples + 25]).toBeCloseTo(-1, 12);
    expect(f[0 * nSamples + 0]).toBe(0.5);
    expect(f[10 * nSamples + 0]).toBe(0.5);
    expect(d.edits.length).toBe(1);
    d.undo();
    expect(Array.from(d.effectiveTraces()!)).toEqual(Array.from(estimate(0.5).slopeTraces));
    d.redo();
    expect(d.effectiveTraces()![10 * nSamples + 25]).toBeCloseTo(-1, 12);
  });

  it('re-estimating keeps the edits (they are re-applied to the new estimate)', () => {
    const d = new DipsState();
    d.setGather(nTraces, nSamples);
    d.setEstimate(estimate(0.5));
    d.brushValue = 2;
    d.brushSoftness = 0;
    d.brush([{ trace: 5, sample: 10 }], 1);
    d.setEstimate(estimate(-0.25));
    const f = d.effectiveTraces()!;
    expect(d.edits.length).toBe(1);
    expect(f[5 * nSamples + 10]).toBeCloseTo(2, 12);
    expect(f[15 * nSamples + 40]).toBe(-0.25);
  });

  it('restore drops every edit in one step, and undo brings them back', () => {
    const d = new DipsState();
    d.setGather(nTraces, nSamples);
    d.setEstimate(estimate(0));
    d.brushValue = 1;
    d.brush([{ trace: 3, sample: 5 }], 1);
    d.regionMode = 'set';
    d.regionValue = 0.75;
    d.region([{ trace: 12, sample: 10 }, { trace: 18, sample: 10 }, { trace: 18, sample: 30 }, { trace: 12, sample: 30 }]);
    expect(d.edits.length).toBe(2);
    d.restoreAll();
    expect(d.edits.length).toBe(0);
    expect(d.effectiveTraces()!.every((v) => v === 0)).toBe(true);
    d.undo();
    expect(d.edits.length).toBe(2);
    expect(d.effectivePairs()![14 * nSamples + 20]).toBe(0.75);
  });

  it('event link needs a pick on each side; the field between follows the straight path for equal end slopes', () => {
    const d = new DipsState();
    d.setGather(nTraces, nSamples);
    d.setEstimate(estimate(1));
    expect(d.pickLink({ trace: 4, sample: 10 })).toBe('first');
    expect(d.pickLink({ trace: 4.3, sample: 12 })).toBe('same-side');
    expect(d.pickLink({ trace: 14, sample: 20 })).toBe('linked');
    // Ends 10 traces and 10 samples apart with end slopes 1: the Hermite path is the straight line, slope 1.
    const p = d.effectivePairs()!;
    expect(p[9 * nSamples + 15]).toBeCloseTo(1, 12);
    expect(effectiveEdits(d.history)[0].kind).toBe('link');
  });

  it('setGather with saved edits starts a fresh history holding them', () => {
    const d = new DipsState();
    d.setGather(nTraces, nSamples, [{ kind: 'brush', mode: 'add', slopeSamplesPerTrace: 0.5, points: [{ trace: 2, sample: 2 }], radiusTraces: 1, radiusSamples: 1, softness: 0 }]);
    expect(d.edits.length).toBe(1);
    expect(d.canRedo).toBe(false);
    d.setEstimate(estimate(0));
    expect(d.effectivePairs()![1 * nSamples + 2]).toBeCloseTo(0.5, 12);
  });
});
