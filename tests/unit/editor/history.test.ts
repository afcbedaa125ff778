import { describe, expect, it } from 'vitest';
import { canRedo, canUndo, commit, createHistory, HISTORY_LIMIT, redo, undo } from '@/editor/history';

describe('the snapshot history', () => {
  const a = { v: 'a' };
  const b = { v: 'b' };
  const c = { v: 'c' };

  it('gives back the same document objects on undo and redo', () => {
    const h = commit(commit(createHistory(a, 0), b, 1), c, 2);
    const back = undo(undo(h));
    expect(back.present.doc).toBe(a);
    expect(canUndo(back)).toBe(false);
    const forward = redo(redo(back));
    expect(forward.present).toEqual({ doc: c, selection: 2 });
    expect(forward.present.doc).toBe(c);
    expect(canRedo(forward)).toBe(false);
  });

  it('records nothing when an edit returns the same document', () => {
    const h = createHistory(a, 0);
    expect(commit(h, a, 5)).toBe(h);
  });

  it('merges commits with the same coalesce key into one undo step', () => {
    let h = createHistory(a, 0);
    h = commit(h, b, 0, 'operand:x');
    h = commit(h, c, 0, 'operand:x');
    expect(h.past).toHaveLength(1);
    expect(undo(h).present.doc).toBe(a);
  });

  it('drops the redo branch when a new edit follows an undo', () => {
    const h = commit(undo(commit(createHistory(a, 0), b, 0)), c, 0);
    expect(canRedo(h)).toBe(false);
    expect(undo(h).present.doc).toBe(a);
  });

  it('keeps at most the history limit of undo steps', () => {
    let h = createHistory<number, null>(0, null);
    for (let i = 1; i <= HISTORY_LIMIT + 20; i += 1) h = commit(h, i, null);
    expect(h.past).toHaveLength(HISTORY_LIMIT);
    expect(h.past[0]!.doc).toBe(20);
  });
});
