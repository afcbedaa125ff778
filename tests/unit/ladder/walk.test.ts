import { describe, expect, it } from 'vitest';
import { allIds, elementsOf, findElement, findPath, getNode, replaceNode, updateNode } from '@shared/ladder/walk';
import { no, threeWireForward } from './fixtures';

describe('network walking', () => {
  const doc = threeWireForward();
  const rung = doc.rungs[0]!;

  it('lists a rung\'s elements left to right with their paths', () => {
    expect(elementsOf(rung).map(({ element, path }) => [element.id, path])).toEqual([
      ['c1', [0]],
      ['c2', [1, 0]],
      ['c3', [1, 1]],
      ['c4', [2]],
      ['k1', [3]],
    ]);
  });

  it('finds nodes by path and by id', () => {
    expect(getNode(rung.network, [1, 1])?.id).toBe('c3');
    expect(getNode(rung.network, [1, 5])).toBeUndefined();
    expect(getNode(rung.network, [0, 0])).toBeUndefined();
    expect(findPath(rung.network, 'c3')).toEqual([1, 1]);
    expect(findElement(doc, 'k1')).toMatchObject({ path: [3], rung: { id: 'r1' } });
    expect(findElement(doc, 'p1')).toBeNull();
    expect(allIds(doc)).toEqual(['r1', 'r1-net', 'c1', 'p1', 'c2', 'c3', 'c4', 'k1']);
  });

  it('replaces a node sharing every untouched part, and returns the same root when nothing changes', () => {
    const next = replaceNode(rung.network, [1, 0], no('c9', 'S3'));
    expect(getNode(next, [1, 0])?.id).toBe('c9');
    expect(next.items[0]).toBe(rung.network.items[0]);
    expect(updateNode(rung.network, [1, 0], (n) => n)).toBe(rung.network);
    expect(updateNode(rung.network, [9], () => null)).toBe(rung.network);
    expect(updateNode(rung.network, [], () => null)).toBe(rung.network);
  });
});
