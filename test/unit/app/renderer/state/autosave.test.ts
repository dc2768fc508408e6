import { afterEach, describe, expect, it, vi } from 'vitest';
import { Autosaver, lastWork, loadWork, workKey, type KeyValueStore, type SavedWork } from '../../../../../app/renderer/state/autosave';

function memoryStore(): KeyValueStore & { map: Map<string, string> } {
  const map = new Map<string, string>();
  return { map, getItem: (k) => map.get(k) ?? null, setItem: (k, v) => void map.set(k, v), removeItem: (k) => void map.delete(k) };
}

function work(n: number): SavedWork {
  return {
    version: 1, fileName: 'line.sgy', sizeBytes: 1234, gatherKey: 'shot', savedAtIso: `2026-01-01T00:00:0${n}Z`,
    gathers: { '3101': { edits: [{ kind: 'link', from: { trace: 1, sample: 2 }, to: { trace: 9, sample: 4 } }], bad: [n] } }, settings: {},
  };
}

afterEach(() => vi.useRealTimers());

describe('Autosaver', () => {
  it('writes at most delayMs after a change, with the latest state', () => {
    vi.useFakeTimers();
    const store = memoryStore();
    const a = new Autosaver(store, 800);
    a.schedule(() => work(1));
    a.schedule(() => work(2));
    vi.advanceTimersByTime(799);
    expect(store.map.size).toBe(0);
    vi.advanceTimersByTime(1);
    expect(loadWork(store, 'line.sgy', 1234)!.gathers['3101'].bad).toEqual([2]);
    expect(lastWork(store)).toEqual({ fileName: 'line.sgy', sizeBytes: 1234 });
  });

  it('flush writes immediately (page hide) and nothing is pending afterwards', () => {
    const store = memoryStore();
    const a = new Autosaver(store, 10_000);
    a.schedule(() => work(3));
    a.flush();
    expect(a.pending).toBe(false);
    expect(store.map.has(workKey('line.sgy', 1234))).toBe(true);
  });

  it('ignores damaged or foreign entries instead of throwing', () => {
    const store = memoryStore();
    store.setItem(workKey('line.sgy', 1234), '{not json');
    expect(loadWork(store, 'line.sgy', 1234)).toBeNull();
    store.setItem(workKey('line.sgy', 1234), JSON.stringify({ ...work(1), sizeBytes: 99 }));
    expect(loadWork(store, 'line.sgy', 1234)).toBeNull();
    store.setItem(workKey('line.sgy', 1234), JSON.stringify({ ...work(1), gathers: { a: { edits: 'x', bad: [] } } }));
    expect(loadWork(store, 'line.sgy', 1234)).toBeNull();
  });

  it('reports a full store on screen rather than losing work silently', () => {
    const store = memoryStore();
    store.setItem = () => { throw new Error('QuotaExceededError'); };
    const a = new Autosaver(store, 1);
    a.schedule(() => work(1));
    a.flush();
    expect(a.lastError).toContain('Quota');
  });
});
