import { describe, expect, it } from 'vitest';
import { SINK, SOURCE, reduceEdges, type Edge, type Tree } from '@shared/ladder/plcopen/seriesParallel';
import type { PowerElement } from '@shared/ladder/plcopen/readBody';

/** A stand-in contact record; only its localId and y matter to the reduction. */
function leaf(localId: number): Tree {
  const element = { kind: 'contact', localId, y: localId, label: `contact (localId ${localId})`, variant: 'no', operand: `%IX${localId}`, inputs: [], comment: undefined } as PowerElement;
  return { kind: 'element', element };
}
const wire: Tree = { kind: 'wire' };

function reduce(edges: Array<[string, string, Tree]>): Tree | null {
  return reduceEdges(new Map(edges.map(([from, to, tree], index): [number, Edge] => [index, { from, to, tree }])));
}

/** `a b (c | d)` style text of a tree, for short assertions. */
function show(tree: Tree | null): string {
  if (tree === null) return 'not series-parallel';
  if (tree.kind === 'element') return String(tree.element.localId);
  if (tree.kind === 'wire') return '-';
  if (tree.kind === 'series') return tree.items.map(show).join(' ');
  return `(${tree.branches.map(show).join(' | ')})`;
}

describe('series-parallel reduction', () => {
  it('merges a chain into one series', () => {
    expect(show(reduce([[SOURCE, 'a', leaf(1)], ['a', 'b', leaf(2)], ['b', SINK, leaf(3)]]))).toBe('1 2 3');
  });

  it('merges edges with the same ends into one parallel, flattening nested ones', () => {
    expect(show(reduce([[SOURCE, 'm', leaf(1)], [SOURCE, 'm', leaf(2)], ['m', SINK, leaf(3)], ['m', SINK, leaf(4)], ['m', SINK, leaf(5)]]))).toBe('(1 | 2) (3 | 4 | 5)');
  });

  it('drops empty wires in series and keeps one as an empty branch in parallel', () => {
    expect(show(reduce([[SOURCE, 'a', wire], ['a', 'b', leaf(1)], ['b', SINK, wire], [SOURCE, SINK, wire], [SOURCE, SINK, wire]]))).toBe('(1 | -)');
  });

  it('says a bridge (Wheatstone) is not series-parallel', () => {
    expect(reduce([[SOURCE, 'a', leaf(1)], [SOURCE, 'b', leaf(2)], ['a', 'b', leaf(3)], ['a', SINK, leaf(4)], ['b', SINK, leaf(5)]])).toBeNull();
  });

  it('says a graph that never reaches the sink is not series-parallel', () => {
    expect(reduce([[SOURCE, 'a', leaf(1)]])).toBeNull();
  });
});
