import { describe, expect, it } from 'vitest';
import { breakCoalescing, canRedo, canUndo, commit, createHistory, HISTORY_LIMIT, redo, undo } from '@/lib/editor/history';

describe('undo/redo history (common practice, no published source)', () => {
  it('undoes and redoes in order, and a new change clears redo', () => {
    let h = createHistory('a');
    h = commit(h, 'b', 'one');
    h = commit(h, 'c', 'two');
    expect(h.present).toBe('c');
    h = undo(h);
    expect(h.present).toBe('b');
    expect(h.futureLabels).toEqual(['two']);
    h = undo(h);
    expect(h.present).toBe('a');
    expect(canUndo(h)).toBe(false);
    h = redo(h);
    expect(h.present).toBe('b');
    h = commit(h, 'x', 'three');
    expect(canRedo(h)).toBe(false);
    expect(h.past).toEqual(['a', 'b']);
  });

  it('ignores commits that change nothing', () => {
    const h = createHistory('a');
    expect(commit(h, 'a')).toBe(h);
  });

  it('coalesces consecutive commits with the same key into one step', () => {
    let h = createHistory(0);
    h = commit(h, 1, 'nudge', 'nudge');
    h = commit(h, 2, 'nudge', 'nudge');
    h = commit(h, 3, 'nudge', 'nudge');
    expect(h.past).toEqual([0]);
    h = breakCoalescing(h);
    h = commit(h, 4, 'nudge', 'nudge');
    expect(h.past).toEqual([0, 3]);
    expect(undo(undo(h)).present).toBe(0);
  });

  it('keeps at most HISTORY_LIMIT steps', () => {
    let h = createHistory(0);
    for (let i = 1; i <= HISTORY_LIMIT + 10; i++) h = commit(h, i);
    expect(h.past.length).toBe(HISTORY_LIMIT);
    expect(h.past[0]).toBe(10);
  });
});
