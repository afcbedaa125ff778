/**
 * Helpers over a rung's series-parallel network. A path indexes from the rung's root series:
 * `[2, 0, 1]` is `items[2]` of the root, then `branches[0]` of that parallel, then `items[1]` of that
 * series. Every function here is pure and returns new objects where it changes something, sharing
 * the parts it leaves alone.
 */
import type { Element, NetworkNode, NodePath, Parallel, Program, Rung, Series } from './schema';

/** An element and where it sits. */
export interface LocatedElement {
  element: Element;
  path: number[];
}

/** The children of a node: a series' items, a parallel's branches, nothing for an element. */
export function childrenOf(node: NetworkNode): readonly NetworkNode[] {
  if (node.kind === 'series') return node.items;
  if (node.kind === 'parallel') return node.branches;
  return [];
}

/** True for a contact, coil or block (as opposed to a series or parallel). */
export function isElement(node: NetworkNode): node is Element {
  return node.kind === 'contact' || node.kind === 'coil' || node.kind === 'block';
}

/** Give a container new children, keeping its kind and id. */
export function withChildren(node: Series | Parallel, children: NetworkNode[]): Series | Parallel {
  return node.kind === 'series' ? { ...node, items: children } : { ...node, branches: children };
}

/**
 * Visit every node below `root` depth first, left to right and top to bottom, with its path.
 * The root itself is visited first with the empty path.
 */
export function visitNodes(root: NetworkNode, visit: (node: NetworkNode, path: number[]) => void): void {
  const walk = (node: NetworkNode, path: number[]): void => {
    visit(node, path);
    childrenOf(node).forEach((child, index) => walk(child, [...path, index]));
  };
  walk(root, []);
}

/** The elements of a rung in left-to-right order (branches top to bottom), with their paths. */
export function elementsOf(rung: Rung): LocatedElement[] {
  const found: LocatedElement[] = [];
  visitNodes(rung.network, (node, path) => {
    if (isElement(node)) found.push({ element: node, path });
  });
  return found;
}

/** Every element of the program with its rung. */
export function elementsOfProgram(program: Program): Array<LocatedElement & { rung: Rung }> {
  const found: Array<LocatedElement & { rung: Rung }> = [];
  for (const rung of program.rungs) {
    visitNodes(rung.network, (node, path) => {
      if (isElement(node)) found.push({ element: node, path, rung });
    });
  }
  return found;
}

/** The node at a path, or `undefined` when the path leads nowhere. */
export function getNode(root: NetworkNode, path: NodePath): NetworkNode | undefined {
  let node: NetworkNode | undefined = root;
  for (const index of path) {
    if (node === undefined) return undefined;
    node = childrenOf(node)[index];
  }
  return node;
}

/**
 * Replace the node at `path` by the result of `change`; return the same root when `change` returns
 * the node it was given or when the path leads nowhere. `change` may return `null` to remove the
 * node from its container. The root cannot be removed (returns the root unchanged).
 */
export function updateNode(
  root: Series,
  path: NodePath,
  change: (node: NetworkNode) => NetworkNode | null,
): Series {
  const updated = updateWithin(root, path, change);
  if (updated === null || updated.kind !== 'series') return root;
  return updated;
}

function updateWithin(
  node: NetworkNode,
  path: NodePath,
  change: (node: NetworkNode) => NetworkNode | null,
): NetworkNode | null {
  if (path.length === 0) return change(node);
  if (isElement(node)) return node;
  const [index, ...rest] = path as [number, ...number[]];
  const children = childrenOf(node);
  const child = children[index];
  if (child === undefined) return node;
  const next = updateWithin(child, rest, change);
  if (next === child) return node;
  const copy = children.slice();
  if (next === null) copy.splice(index, 1);
  else copy[index] = next;
  return withChildren(node, copy);
}

/** Replace the node at a path (see `updateNode`). */
export function replaceNode(root: Series, path: NodePath, node: NetworkNode): Series {
  return updateNode(root, path, () => node);
}

/** Where a node with this id sits in the network, or `null`. */
export function findPath(root: NetworkNode, id: string): number[] | null {
  let found: number[] | null = null;
  visitNodes(root, (node, path) => {
    if (found === null && node.id === id) found = path;
  });
  return found;
}

/** Every id in the program: rungs and every network node, in document order. */
export function allIds(program: Program): string[] {
  const ids: string[] = [];
  for (const rung of program.rungs) {
    ids.push(rung.id);
    visitNodes(rung.network, (node) => ids.push(node.id));
  }
  return ids;
}

/** Find an element by id anywhere in the program. */
export function findElement(program: Program, id: string): (LocatedElement & { rung: Rung }) | null {
  for (const rung of program.rungs) {
    const path = findPath(rung.network, id);
    if (path === null) continue;
    const node = getNode(rung.network, path);
    if (node && isElement(node)) return { element: node, path, rung };
  }
  return null;
}
