import { describe, expect, it } from 'vitest';
import { EditHistory } from '../../../../../app/renderer/state/history';

describe('EditHistory (undo/redo without limit)', () => {
  it('undoes and redoes in order, and a new edit clears the redo list', () => {
    const h = new EditHistory<number>();
    for (let i = 0; i < 5; i++) h.push(i);
    expect(h.undo()).toBe(4);
    expect(h.undo()).toBe(3);
    expect(h.edits).toEqual([0, 1, 2]);
    expect(h.redo()).toBe(3);
    expect(h.edits).toEqual([0, 1, 2, 3]);
    h.push(9);
    expect(h.canRedo).toBe(false);
    expect(h.redo()).toBeUndefined();
    expect(h.edits).toEqual([0, 1, 2, 3, 9]);
  });

  it('keeps 10 000 steps (no limit in a session) and returns to empty', () => {
    const h = new EditHistory<number>();
    for (let i = 0; i < 10_000; i++) h.push(i);
    let n = 0;
    while (h.undo() !== undefined) n++;
    expect(n).toBe(10_000);
    expect(h.canUndo).toBe(false);
    while (h.redo() !== undefined) n--;
    expect(n).toBe(0);
    expect(h.edits.length).toBe(10_000);
  });

  it('bumps the version on every change only', () => {
    const h = new EditHistory<string>();
    const v0 = h.version;
    h.undo();
    expect(h.version).toBe(v0);
    h.push('a');
    h.undo();
    h.redo();
    expect(h.version).toBe(v0 + 3);
  });
});
