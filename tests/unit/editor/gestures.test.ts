import { describe, expect, it } from 'vitest';
import { rungText } from '@shared/ladder/text';
import type { Program } from '@shared/ladder/schema';
import { shownText } from '@/editor/draftText';
import { createElement } from '@/editor/elementFactory';
import { addBranchUnder, addEmptyRung, deleteElements, deleteRungs, freshCopies, insertAtSlot, moveElementBy, pasteRungs, wrapElements } from '@/editor/gestures';
import { paletteItem } from '@/editor/palette';
import { slotInsertTarget } from '@/editor/slots';
import { coil, nc, no, parallel, program, rung, series, threeWire } from './fixtures';

const text = (doc: Program, index = 0) => rungText(doc.rungs[index]!, doc);

describe('drop slots on the shared insert edit', () => {
  it('maps a gap in a series to before the first item or after the item left of it', () => {
    const doc = threeWire();
    expect(slotInsertTarget(doc, { rungId: 'r1', path: [], index: 0 })).toEqual({ rungId: 'r1', path: [0], position: 'before' });
    expect(slotInsertTarget(doc, { rungId: 'r1', path: [], index: 2 })).toEqual({ rungId: 'r1', path: [1], position: 'after' });
    expect(slotInsertTarget(doc, { rungId: 'r1', path: [], index: 99 })).toEqual({ rungId: 'r1', path: [2], position: 'after' });
    expect(slotInsertTarget(doc, { rungId: 'nope', path: [], index: 0 })).toBeUndefined();
    expect(slotInsertTarget(doc, { rungId: 'r1', path: [1], index: 0 })).toBeUndefined();
  });

  it('inserts a palette element inside a branch of a parallel', () => {
    const doc = threeWire();
    const element = createElement(paletteItem('contact:nc')!, 'x1', doc);
    expect(element).toEqual(nc('x1', ''));
    const next = insertAtSlot(doc, { rungId: 'r1', path: [1, 0], index: 1 }, [nc('x1', 'S3')]);
    expect(text(next)).toBe('S1 AND (S2 AND NOT S3 OR K1) -> K1');
  });

  it('turns a lone branch element into a series when dropping beside it', () => {
    const doc = program([rung('r1', series('n', parallel('p', no('a', 'S1'), no('b', 'S2')), coil('q', '%QX1')))]);
    const next = insertAtSlot(doc, { rungId: 'r1', path: [0, 1], index: 0 }, [nc('c', 'S3')]);
    expect(text(next)).toBe('(S1 OR NOT S3 AND S2) -> %QX1');
  });

  it('fills an empty rung from its one slot, and pastes several elements in order', () => {
    const doc = program([rung('r1', series('n'))]);
    const next = insertAtSlot(doc, { rungId: 'r1', path: [], index: 0 }, [no('a', 'S1'), nc('b', 'S2'), coil('q', '%QX1')]);
    expect(text(next)).toBe('S1 AND NOT S2 -> %QX1');
  });

  it('gives pasted copies ids unused in the document', () => {
    const doc = threeWire();
    const copies = freshCopies(doc, [no('stop', 'S1'), coil('k1', '%QX1')]);
    const ids = copies.map((c) => c.id);
    expect(ids).not.toContain('stop');
    expect(ids).not.toContain('k1');
    expect(new Set(ids).size).toBe(2);
  });
});

describe('element gestures by id', () => {
  it('deletes elements and collapses the parallel left with one branch', () => {
    const next = deleteElements(threeWire(), ['seal']);
    expect(text(next)).toBe('S1 AND S2 -> K1');
    expect(next.rungs[0]!.network.items.map((n) => n.kind)).toEqual(['contact', 'contact', 'coil']);
  });

  it('wraps contiguous siblings and refuses elements of different series', () => {
    const doc = program([rung('r1', series('n', no('a', 'S1'), no('b', 'S2'), coil('q', '%QX1')))]);
    const wrapped = wrapElements(doc, ['a', 'b']).rungs[0]!.network.items[0]!;
    expect(wrapped.kind === 'parallel' && wrapped.branches.map((b) => b.kind)).toEqual(['series', 'series']);
    expect(wrapElements(threeWire(), ['stop', 'start'])).toEqual(threeWire());
  });

  it('adds a branch under a whole branch in the same parallel, not a nested one', () => {
    const next = addBranchUnder(threeWire(), 'start');
    const par = next.rungs[0]!.network.items[1]!;
    expect(par.kind === 'parallel' && par.branches.map((b) => b.id)).toEqual(['b1', expect.any(String), 'b2']);
    expect(par.kind === 'parallel' && par.branches[1]).toMatchObject({ kind: 'series', items: [] });
  });

  it('adds a branch under an element of the main series by wrapping it', () => {
    const next = addBranchUnder(threeWire(), 'stop');
    const first = next.rungs[0]!.network.items[0]!;
    expect(first.kind === 'parallel' && first.branches[0]!.id).toBe('stop');
  });

  it('moves an element along the rung and stops at the ends', () => {
    const doc = threeWire();
    expect(moveElementBy(doc, 'stop', 1).rungs[0]!.network.items.map((n) => n.id)).toEqual(['p1', 'stop', 'k1']);
    expect(moveElementBy(doc, 'stop', -1)).toBe(doc);
    expect(moveElementBy(doc, 'nope', 1)).toBe(doc);
  });
});

describe('rung gestures', () => {
  it('adds an empty rung at a position and names it', () => {
    const added = addEmptyRung(threeWire(), 0);
    expect(added.doc.rungs[0]!.id).toBe(added.rungId);
    expect(added.doc.rungs[0]!.network.items).toEqual([]);
    expect(added.doc.rungs[1]!.id).toBe('r1');
  });

  it('pastes rung copies with fresh ids after a position and deletes them again', () => {
    const doc = threeWire();
    const pasted = pasteRungs(doc, 1, [doc.rungs[0]!, doc.rungs[0]!]);
    expect(pasted.doc.rungs.map((r) => r.id)).toEqual(['r1', ...pasted.rungIds]);
    expect(new Set(pasted.rungIds).size).toBe(2);
    expect(text(pasted.doc, 1)).toBe(text(doc, 0));
    expect(JSON.stringify(pasted.doc.rungs[2]).includes('"stop"')).toBe(false);
    expect(deleteRungs(pasted.doc, pasted.rungIds)).toEqual(doc);
  });
});

describe('text fields over trimming edits', () => {
  it('keeps the space just typed while it means the stored text', () => {
    expect(shownText('Stop ', 'Stop')).toBe('Stop ');
    expect(shownText('Stop', 'Start')).toBe('Start');
    expect(shownText(undefined, 'Start')).toBe('Start');
  });
});
