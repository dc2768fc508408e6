import { describe, expect, it } from 'vitest';
import { FillState, describeHoldout } from '../../../../../app/renderer/state/fill.svelte';

describe('FillState: plan, marked traces, progress', () => {
  it('plans the gap and the decimation from the recorded positions, and toggles bad traces', () => {
    const present = new Uint8Array(30).fill(1);
    for (let i = 10; i < 16; i++) present[i] = 0;
    const f = new FillState();
    f.setGather(present, new Uint8Array(30));
    expect(f.toFill).toBe(6);
    expect(f.toggleBad(3)).toBe(true);
    expect(f.badTraces).toEqual([3]);
    expect(f.toFill).toBe(7);
    expect(f.toggleBad(12)).toBe(false); // absent positions are filled anyway
    expect(f.toggleBad(3)).toBe(true);
    expect(f.badTraces).toEqual([]);
    expect(Array.from(f.unknown).reduce((a, b) => a + b, 0)).toBe(6);
  });

  it('drops saved bad marks that no longer point at a recorded trace', () => {
    const present = new Uint8Array(8).fill(1);
    present[2] = 0;
    const f = new FillState();
    f.setGather(present, new Uint8Array(8), [2, 5, 99]);
    expect(f.badTraces).toEqual([5]);
  });

  it('extrapolates time left from the overall fraction and keeps the loss x axis increasing across stages', () => {
    const f = new FillState();
    f.begin(0);
    f.progress('fill', 0.25, { step: 10, totalSteps: 40, terms: { data: 1, pde: 2 }, elapsedSeconds: 1, secondsLeft: 3 }, 2000);
    expect(f.running!.secondsLeft).toBeCloseTo(6, 12); // 2 s for 25 % → 6 s for the rest
    f.progress('fill', 0.5, { step: 20, totalSteps: 40, terms: { data: 0.5, pde: 1 }, elapsedSeconds: 2, secondsLeft: 2 }, 4000);
    f.progress('holdout', 0.6, { step: 5, totalSteps: 40, terms: { data: 0.9, pde: 1 }, elapsedSeconds: 2, secondsLeft: 2 }, 4500);
    expect(f.loss.map((p) => p.step)).toEqual([10, 20, 25]);
    f.finish(null);
    expect(f.running).toBeNull();
  });
});

describe('describeHoldout', () => {
  // SNR arithmetic (methods.md §6.7): 20 dB ↔ error 10 % of the RMS, 6.02 dB ↔ 50 %.
  it('turns dB into the relative error it means', () => {
    expect(describeHoldout(20).text).toContain('10%');
    expect(describeHoldout(6.0206).text).toContain('50%');
    expect(describeHoldout(3).band).toBe('poor');
    expect(describeHoldout(null).band).toBe('none');
    expect(describeHoldout(Number.POSITIVE_INFINITY).band).toBe('excellent');
  });
});
