import { describe, expect, it } from 'vitest';
import {
  addBranchBelow,
  appendElement,
  deleteNodes,
  insertElement,
  insertElements,
  moveElement,
  normalizeNetwork,
  wrapInParallel,
} from '@shared/ladder/edits';
import { rungText } from '@shared/ladder/text';
import type { Program } from '@shared/ladder/schema';
import { block, coil, no, parallel, program, rung, series, threeWireForward, CONVEYOR_TAGS } from './fixtures';

const text = (doc: Program, index = 0) => rungText(doc.rungs[index]!, doc);
const simple = () => program([rung('r1', no('c1', 'S1'), coil('k1', 'K1'))], CONVEYOR_TAGS);

describe('insertElement', () => {
  it('puts a contact before or after a node of the root series', () => {
    const doc = simple();
    expect(text(insertElement(doc, { rungId: 'r1', path: [0], position: 'after', element: no('c2', 'S2') }))).toBe('S1 AND S2 -> K1');
    expect(text(insertElement(doc, { rungId: 'r1', path: [0], position: 'before', element: no('c2', 'S2') }))).toBe('S2 AND S1 -> K1');
  });

  it('turns a branch into a series when inserting beside it', () => {
    const doc = threeWireForward();
    const next = insertElement(doc, { rungId: 'r1', path: [1, 0], position: 'after', element: no('c9', 'S3') });
    expect(text(next)).toBe('S1 AND (S2 AND S3 OR K1) AND NOT K2 -> K1');
    const branch = (next.rungs[0]!.network.items[1] as { branches: { kind: string; id: string }[] }).branches[0]!;
    expect(branch.kind).toBe('series');
    expect(branch.id).toBe('ser1');
  });

  it('inserts at the start or end of the rung for the root path', () => {
    expect(text(insertElement(simple(), { rungId: 'r1', path: [], position: 'before', element: no('c2', 'S2') }))).toBe('S2 AND S1 -> K1');
  });

  it('gives the element a fresh id when its own is taken', () => {
    const next = insertElement(simple(), { rungId: 'r1', path: [0], position: 'after', element: no('c1', 'S2') });
    expect(next.rungs[0]!.network.items.map((n) => n.id)).toEqual(['c1', 'con1', 'k1']);
  });

  it('returns the same document for a missing rung, a bad path or an invalid element', () => {
    const doc = simple();
    expect(insertElement(doc, { rungId: 'nope', path: [0], position: 'after', element: no('x', 'S2') })).toBe(doc);
    expect(insertElement(doc, { rungId: 'r1', path: [7], position: 'after', element: no('x', 'S2') })).toBe(doc);
    expect(insertElement(doc, { rungId: 'r1', path: [0, 0], position: 'after', element: no('x', 'S2') })).toBe(doc);
    expect(insertElement(doc, { rungId: 'r1', path: [0], position: 'after', element: { kind: 'lamp', id: 'x' } })).toBe(doc);
  });
});

describe('insertElements', () => {
  it('puts a run of elements in series after a node, in the order given', () => {
    const next = insertElements(simple(), { rungId: 'r1', path: [0], position: 'after', elements: [no('c2', 'S2'), no('c3', 'S3')] });
    expect(text(next)).toBe('S1 AND S2 AND S3 -> K1');
    expect(next.rungs[0]!.network.items.map((n) => n.id)).toEqual(['c1', 'c2', 'c3', 'k1']);
  });

  it('turns a lone branch into a series holding the branch and the run', () => {
    const next = insertElements(threeWireForward(), { rungId: 'r1', path: [1, 0], position: 'before', elements: [no('c8', 'S3'), no('c9', 'S1')] });
    expect(text(next)).toBe('S1 AND (S3 AND S1 AND S2 OR K1) AND NOT K2 -> K1');
  });

  it('fills an empty branch series of a parallel', () => {
    const doc = program([rung('r1', parallel('p1', no('c1', 'S1'), series('s9')), coil('k1', 'K1'))], CONVEYOR_TAGS);
    const next = insertElements(doc, { rungId: 'r1', path: [0, 1], position: 'before', elements: [no('c2', 'S2')] });
    expect(text(next)).toBe('(S1 OR S2) -> K1');
  });

  it('gives taken ids fresh ones, each distinct', () => {
    const next = insertElements(simple(), { rungId: 'r1', path: [0], position: 'after', elements: [no('c1', 'S2'), no('c1', 'S3')] });
    const ids = next.rungs[0]!.network.items.map((n) => n.id);
    expect(new Set(ids).size).toBe(4);
    expect(ids[0]).toBe('c1');
  });

  it('inserts nothing when any element is invalid, or the run is empty', () => {
    const doc = simple();
    expect(insertElements(doc, { rungId: 'r1', path: [0], position: 'after', elements: [no('c2', 'S2'), { kind: 'lamp' }] })).toBe(doc);
    expect(insertElements(doc, { rungId: 'r1', path: [0], position: 'after', elements: [] })).toBe(doc);
  });
});

describe('appendElement', () => {
  it('adds a contact before the coils and a coil at the end', () => {
    let doc = simple();
    doc = appendElement(doc, { rungId: 'r1', element: no('c2', 'S2') });
    expect(text(doc)).toBe('S1 AND S2 -> K1');
    doc = appendElement(doc, { rungId: 'r1', element: coil('k2', 'P1') });
    expect(text(doc)).toBe('S1 AND S2 -> K1, P1');
    doc = appendElement(doc, { rungId: 'r1', element: block('b1', 'TON', 'T1', { PT: 'T#2s' }) });
    expect(text(doc)).toBe('TON T1(IN := S1 AND S2, PT := T#2s) -> K1, P1');
  });

  it('adds a contact before a final output parallel', () => {
    const doc = program([rung('r1', no('c1', 'S1'), parallel('p1', coil('k1', 'K1'), coil('k2', 'P1')))], CONVEYOR_TAGS);
    expect(text(appendElement(doc, { rungId: 'r1', element: no('c2', 'S2') }))).toBe('S1 AND S2 -> K1, P1');
  });
});

describe('wrapInParallel', () => {
  it('wraps one element in a parallel with an empty second branch', () => {
    const next = wrapInParallel(simple(), { rungId: 'r1', paths: [[0]] });
    const wrapped = next.rungs[0]!.network.items[0]!;
    expect(wrapped).toEqual({ kind: 'parallel', id: 'par1', branches: [no('c1', 'S1'), { kind: 'series', id: 'ser1', items: [] }] });
  });

  it('wraps a contiguous selection and adds the given element as the second branch', () => {
    const doc = program([rung('r1', no('c1', 'S1'), no('c2', 'S2'), coil('k1', 'K1'))], CONVEYOR_TAGS);
    const next = wrapInParallel(doc, { rungId: 'r1', paths: [[1], [0]], element: no('c3', 'K1') });
    expect(text(next)).toBe('(S1 AND S2 OR K1) -> K1');
  });

  it('refuses a selection that is not contiguous or not siblings in a series', () => {
    const doc = program([rung('r1', no('c1', 'S1'), no('c2', 'S2'), no('c3', 'S3'), coil('k1', 'K1'))], CONVEYOR_TAGS);
    expect(wrapInParallel(doc, { rungId: 'r1', paths: [[0], [2]] })).toBe(doc);
    expect(wrapInParallel(doc, { rungId: 'r1', paths: [] })).toBe(doc);
    expect(wrapInParallel(doc, { rungId: 'r1', paths: [[]] })).toBe(doc);
    const three = threeWireForward();
    expect(wrapInParallel(three, { rungId: 'r1', paths: [[1, 0]] })).toBe(three);
  });
});

describe('addBranchBelow', () => {
  it('makes a parallel of a series element and the new one', () => {
    expect(text(addBranchBelow(simple(), { rungId: 'r1', path: [0], element: no('c2', 'K1') }))).toBe('(S1 OR K1) -> K1');
  });

  it('adds a branch right under a branch, or at the end of a parallel', () => {
    const doc = threeWireForward();
    expect(text(addBranchBelow(doc, { rungId: 'r1', path: [1, 0], element: no('c9', 'S3') }))).toBe('S1 AND (S2 OR S3 OR K1) AND NOT K2 -> K1');
    expect(text(addBranchBelow(doc, { rungId: 'r1', path: [1], element: no('c9', 'S3') }))).toBe('S1 AND (S2 OR K1 OR S3) AND NOT K2 -> K1');
  });

  it('adds an empty branch series when no element is given', () => {
    const next = addBranchBelow(threeWireForward(), { rungId: 'r1', path: [1, 0] });
    const par = next.rungs[0]!.network.items[1] as { kind: string; branches: { kind: string; items?: unknown[] }[] };
    expect(par.branches).toHaveLength(3);
    expect(par.branches[1]).toMatchObject({ kind: 'series', items: [] });
    const wrapped = addBranchBelow(simple(), { rungId: 'r1', path: [0] }).rungs[0]!.network.items[0]!;
    expect(wrapped.kind === 'parallel' && wrapped.branches.map((b) => b.kind)).toEqual(['contact', 'series']);
  });

  it('refuses an invalid element rather than adding an empty branch', () => {
    const doc = simple();
    expect(addBranchBelow(doc, { rungId: 'r1', path: [0], element: { kind: 'lamp' } })).toBe(doc);
  });

  it('returns the same document for the root path', () => {
    const doc = simple();
    expect(addBranchBelow(doc, { rungId: 'r1', path: [], element: no('c2', 'S2') })).toBe(doc);
  });
});

describe('deleteNodes', () => {
  it('deletes elements and collapses a parallel left with one branch', () => {
    const next = deleteNodes(threeWireForward(), { rungId: 'r1', paths: [[1, 1]] });
    expect(text(next)).toBe('S1 AND S2 AND NOT K2 -> K1');
    expect(next.rungs[0]!.network.items.map((n) => n.id)).toEqual(['c1', 'c2', 'c4', 'k1']);
  });

  it('deletes several nodes at once, deepest and last first', () => {
    const next = deleteNodes(threeWireForward(), { rungId: 'r1', paths: [[0], [1, 0], [2]] });
    expect(text(next)).toBe('K1 -> K1');
  });

  it('flattens nested series, and keeps an empty branch drawn beside the element deleted', () => {
    const doc = program([rung('r1', series('s1', no('c1', 'S1'), series('s2', no('c2', 'S2'))), parallel('p1', no('c3', 'S3'), series('s3')), coil('k1', 'K1'), coil('k2', 'P1'))], CONVEYOR_TAGS);
    const next = deleteNodes(doc, { rungId: 'r1', paths: [[3]] });
    expect(next.rungs[0]!.network.items.map((n) => n.id)).toEqual(['c1', 'c2', 'p1', 'k1']);
    expect(next.rungs[0]!.network.items[2]).toEqual(parallel('p1', no('c3', 'S3'), series('s3')));
  });

  it('keeps a new empty branch when the element in series before or after its parallel is deleted', () => {
    // Stop, then start with an empty branch drawn under it for the seal-in, then the coil.
    const doc = program([rung('r1', no('c1', 'S1'), parallel('p1', no('c2', 'S2'), series('s9')), coil('k1', 'K1'))], CONVEYOR_TAGS);
    const withoutStop = deleteNodes(doc, { rungId: 'r1', paths: [[0]] });
    expect(withoutStop.rungs[0]!.network.items).toEqual([parallel('p1', no('c2', 'S2'), series('s9')), coil('k1', 'K1')]);
    const withoutCoil = deleteNodes(doc, { rungId: 'r1', paths: [[2]] });
    expect(withoutCoil.rungs[0]!.network.items).toEqual([no('c1', 'S1'), parallel('p1', no('c2', 'S2'), series('s9'))]);
  });

  it('removes a branch the deletion emptied, and a parallel left with only an empty branch', () => {
    const doc = program([rung('r1', parallel('p1', series('s1', no('c2', 'S2')), series('s9')), coil('k1', 'K1'))], CONVEYOR_TAGS);
    // The start button was the branch's only element: the parallel is left with just the empty branch, and goes.
    expect(text(deleteNodes(doc, { rungId: 'r1', paths: [[0, 0, 0]] }))).toBe(text(program([rung('r1', coil('k1', 'K1'))], CONVEYOR_TAGS)));
    const three = program([rung('r1', parallel('p1', no('c2', 'S2'), no('c3', 'K1'), series('s9')), coil('k1', 'K1'))], CONVEYOR_TAGS);
    expect(deleteNodes(three, { rungId: 'r1', paths: [[0, 1]] }).rungs[0]!.network.items[0]).toEqual(parallel('p1', no('c2', 'S2'), series('s9')));
  });

  it('returns the same document when no path leads anywhere', () => {
    const doc = simple();
    expect(deleteNodes(doc, { rungId: 'r1', paths: [[5], []] })).toBe(doc);
  });

  it('is undone by inserting the element back', () => {
    const doc = simple();
    const removed = deleteNodes(doc, { rungId: 'r1', paths: [[0]] });
    expect(insertElement(removed, { rungId: 'r1', path: [0], position: 'before', element: no('c1', 'S1') })).toEqual(doc);
  });
});

describe('moveElement', () => {
  it('swaps an element with its neighbour, and moving back restores the document', () => {
    const doc = program([rung('r1', no('c1', 'S1'), no('c2', 'S2'), coil('k1', 'K1'))], CONVEYOR_TAGS);
    const moved = moveElement(doc, { rungId: 'r1', path: [0], offset: 1 });
    expect(text(moved)).toBe('S2 AND S1 -> K1');
    expect(moveElement(moved, { rungId: 'r1', path: [1], offset: -1 })).toEqual(doc);
  });

  it('reorders branches of a parallel', () => {
    expect(text(moveElement(threeWireForward(), { rungId: 'r1', path: [1, 1], offset: -1 }))).toBe('S1 AND (K1 OR S2) AND NOT K2 -> K1');
  });

  it('returns the same document at the ends', () => {
    const doc = simple();
    expect(moveElement(doc, { rungId: 'r1', path: [0], offset: -1 })).toBe(doc);
    expect(moveElement(doc, { rungId: 'r1', path: [1], offset: 1 })).toBe(doc);
    expect(moveElement(doc, { rungId: 'r1', path: [], offset: 1 })).toBe(doc);
  });
});

describe('normalizeNetwork', () => {
  it('returns the same object for a network already in normal form', () => {
    const root = threeWireForward().rungs[0]!.network;
    expect(normalizeNetwork(root)).toBe(root);
  });

  it('flattens nested series and parallels and collapses single branches', () => {
    const root = series(
      'root',
      series('s1', no('a', 'S1')),
      parallel('p1', series('s2', no('b', 'S2'))),
      parallel('p2', parallel('p3', no('c', 'S3'), no('d', 'S4')), no('e', 'B1')),
      parallel('p4'),
      coil('k', 'K1'),
    );
    const normal = normalizeNetwork(root);
    expect(normal).toEqual(
      series('root', no('a', 'S1'), no('b', 'S2'), parallel('p2', no('c', 'S3'), no('d', 'S4'), no('e', 'B1')), coil('k', 'K1')),
    );
    expect(normalizeNetwork(normal)).toBe(normal);
  });
});
