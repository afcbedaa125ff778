/**
 * Series-parallel reduction of a two-terminal graph whose edges carry networks: edges with the
 * same ends merge into a parallel, a node with one way in and one way out merges its two edges
 * into a series. A graph is series-parallel exactly when this ends in one edge from the source to
 * the sink, whatever order the merges take.
 */
import type { PowerElement } from './readBody';

/** A recovered network: elements, empty wires, series and parallel. */
export type Tree =
  | { kind: 'element'; element: PowerElement }
  | { kind: 'wire' }
  | { kind: 'series'; items: Tree[] }
  | { kind: 'parallel'; branches: Tree[] };

/** The left rail (all left rails are one source) and the right rail, as graph nodes. */
export const SOURCE = 'source';
export const SINK = 'sink';

/** An edge of the graph: a piece of network between two nodes. */
export interface Edge {
  from: string;
  to: string;
  tree: Tree;
}

/**
 * Merge series and parallel edges until nothing changes. Returns the tree of the single edge
 * left from the source to the sink, or `null` when the graph is not series-parallel.
 */
export function reduceEdges(edges: Map<number, Edge>): Tree | null {
  const outOf = new Map<string, Set<number>>();
  const into = new Map<string, Set<number>>();
  const link = (id: number, edge: Edge): void => {
    edges.set(id, edge);
    if (!outOf.has(edge.from)) outOf.set(edge.from, new Set());
    if (!into.has(edge.to)) into.set(edge.to, new Set());
    outOf.get(edge.from)?.add(id);
    into.get(edge.to)?.add(id);
  };
  const unlink = (id: number): Edge => {
    const edge = edges.get(id) as Edge;
    edges.delete(id);
    outOf.get(edge.from)?.delete(id);
    into.get(edge.to)?.delete(id);
    return edge;
  };
  let nextId = Math.max(-1, ...edges.keys()) + 1;
  for (const [id, edge] of [...edges]) link(id, edge);

  const work = new Set<string>([...outOf.keys(), ...into.keys()]);
  while (work.size > 0) {
    const node = work.values().next().value as string;
    work.delete(node);
    // Parallel: edges leaving this node for the same node become one.
    const byTarget = new Map<string, number[]>();
    for (const id of outOf.get(node) ?? []) {
      const to = (edges.get(id) as Edge).to;
      byTarget.set(to, [...(byTarget.get(to) ?? []), id]);
    }
    for (const [to, ids] of byTarget) {
      if (ids.length < 2) continue;
      const trees = ids.map((id) => unlink(id).tree);
      link(nextId, { from: node, to, tree: parallelOf(trees) });
      nextId += 1;
      work.add(node);
      work.add(to);
    }
    // Series: a junction with one way in and one way out disappears.
    const ins = into.get(node);
    const outs = outOf.get(node);
    if (node !== SOURCE && node !== SINK && ins?.size === 1 && outs?.size === 1) {
      const before = unlink(ins.values().next().value as number);
      const after = unlink(outs.values().next().value as number);
      link(nextId, { from: before.from, to: after.to, tree: seriesOf([before.tree, after.tree]) });
      nextId += 1;
      work.add(before.from);
      work.add(after.to);
    }
  }
  const left = [...edges.values()];
  if (left.length !== 1) return null;
  const only = left[0] as Edge;
  return only.from === SOURCE && only.to === SINK ? only.tree : null;
}

function seriesOf(parts: Tree[]): Tree {
  const items = parts.flatMap((t) => (t.kind === 'series' ? t.items : t.kind === 'wire' ? [] : [t]));
  if (items.length === 0) return { kind: 'wire' };
  if (items.length === 1) return items[0] as Tree;
  return { kind: 'series', items };
}

/** Parallel branches, flattened; several empty wires side by side are one. */
function parallelOf(parts: Tree[]): Tree {
  const flat = parts.flatMap((t) => (t.kind === 'parallel' ? t.branches : [t]));
  const solid = flat.filter((t) => t.kind !== 'wire');
  const branches = solid.length < flat.length ? [...solid, { kind: 'wire' } as Tree] : solid;
  if (branches.length === 1) return branches[0] as Tree;
  return { kind: 'parallel', branches };
}

/** Branches top to bottom by position, then localId; an empty wire last (it has no position). */
export function ordered(tree: Tree): Tree {
  if (tree.kind === 'series') return { kind: 'series', items: tree.items.map(ordered) };
  if (tree.kind !== 'parallel') return tree;
  const branches = tree.branches.map(ordered);
  const keyed = branches.map((branch) => ({ branch, ...placement(branch) }));
  keyed.sort((a, b) => a.y - b.y || a.localId - b.localId);
  return { kind: 'parallel', branches: keyed.map((k) => k.branch) };
}

function placement(tree: Tree): { y: number; localId: number } {
  const elements: PowerElement[] = [];
  const collect = (t: Tree): void => {
    if (t.kind === 'element') elements.push(t.element);
    else if (t.kind === 'series') t.items.forEach(collect);
    else if (t.kind === 'parallel') t.branches.forEach(collect);
  };
  collect(tree);
  if (elements.length === 0) return { y: Number.POSITIVE_INFINITY, localId: Number.POSITIVE_INFINITY };
  return { y: Math.min(...elements.map((e) => e.y)), localId: Math.min(...elements.map((e) => e.localId)) };
}

export function depth(tree: Tree): number {
  if (tree.kind === 'series') return 1 + Math.max(0, ...tree.items.map(depth));
  if (tree.kind === 'parallel') return 1 + Math.max(0, ...tree.branches.map(depth));
  return 0;
}
