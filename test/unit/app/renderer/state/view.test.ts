import { describe, expect, it } from 'vitest';
// Zoom/pan arithmetic is our own; the expected windows follow from the definition of zooming about a point.
import { ViewState } from '../../../../../app/renderer/state/view.svelte';

describe('ViewState (zoom, pan, keys)', () => {
  it('zooms about the anchor: the anchor keeps its place in the window', () => {
    const v = new ViewState();
    v.setShape(200, 1000);
    v.zoom(2, 50, 250);
    const w = v.window;
    expect(w.traceEnd - w.traceStart).toBeCloseTo(100, 10);
    expect(w.sampleEnd - w.sampleStart).toBeCloseTo(500, 10);
    // Anchor at 25% across and 25% down before, and after.
    expect((50 - w.traceStart) / (w.traceEnd - w.traceStart)).toBeCloseTo(0.25, 12);
    expect((250 - w.sampleStart) / (w.sampleEnd - w.sampleStart)).toBeCloseTo(0.25, 12);
  });

  it('never pans or zooms outside the gather, nor below the minimum window', () => {
    const v = new ViewState();
    v.setShape(50, 300);
    v.pan(-1000, -1000);
    expect(v.window.traceStart).toBe(0);
    expect(v.window.sampleStart).toBe(0);
    for (let i = 0; i < 60; i++) v.zoom(2, 25, 150);
    expect(v.window.traceEnd - v.window.traceStart).toBeGreaterThanOrEqual(4);
    expect(v.window.sampleEnd - v.window.sampleStart).toBeGreaterThanOrEqual(16);
    v.pan(1e6, 1e6);
    expect(v.window.traceEnd).toBe(50);
    expect(v.window.sampleEnd).toBe(300);
    for (let i = 0; i < 60; i++) v.zoom(0.5, 0, 0);
    expect(v.window).toEqual({ traceStart: 0, traceEnd: 50, sampleStart: 0, sampleEnd: 300 });
  });

  it('time-only zoom leaves the trace range alone', () => {
    const v = new ViewState();
    v.setShape(80, 400);
    v.zoom(4, 40, 200, 'time');
    expect(v.window.traceEnd - v.window.traceStart).toBe(80);
    expect(v.window.sampleEnd - v.window.sampleStart).toBeCloseTo(100, 10);
  });

  it('keys: arrows pan by a tenth, + and − zoom, Home shows all, other keys are not used', () => {
    const v = new ViewState();
    v.setShape(100, 100);
    v.zoom(2, 50, 50);
    const before = { ...v.window };
    expect(v.handleKey('ArrowRight')).toBe(true);
    expect(v.window.traceStart - before.traceStart).toBeCloseTo(5, 10);
    expect(v.handleKey('ArrowDown')).toBe(true);
    expect(v.window.sampleStart - before.sampleStart).toBeCloseTo(5, 10);
    expect(v.handleKey('+')).toBe(true);
    expect(v.window.traceEnd - v.window.traceStart).toBeCloseTo(40, 10);
    expect(v.handleKey('Home')).toBe(true);
    expect(v.window).toEqual({ traceStart: 0, traceEnd: 100, sampleStart: 0, sampleEnd: 100 });
    expect(v.handleKey('q')).toBe(false);
  });

  it('keeps the window when stepping to a gather of the same shape, resets it otherwise', () => {
    const v = new ViewState();
    v.setShape(100, 500);
    v.zoom(2, 10, 10);
    const w = { ...v.window };
    v.setShape(100, 500);
    expect(v.window).toEqual(w);
    v.setShape(120, 500);
    expect(v.window).toEqual({ traceStart: 0, traceEnd: 120, sampleStart: 0, sampleEnd: 500 });
  });

  it('restores only valid settings', () => {
    const v = new ViewState();
    v.restore({ mode: 'both', scale: 'loam', gain: { traceBalance: true, agcWindowMs: -5, clipPercentile: 20 }, wiggleGain: -1, slopeUnit: 's-per-km' });
    expect(v.mode).toBe('both');
    expect(v.scale).toBe('loam');
    expect(v.gain).toEqual({ traceBalance: true, agcWindowMs: 0, clipPercentile: 98 });
    expect(v.wiggleGain).toBe(1);
    expect(v.slopeUnit).toBe('s-per-km');
    v.restore({ mode: 'nonsense' as never });
    expect(v.mode).toBe('both');
  });
});
