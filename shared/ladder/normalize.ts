/**
 * Normal form of a network: no series directly inside a series (flattened), no parallel with a
 * single branch (it becomes its branch), no empty series inside a parallel and no parallel with no
 * branches (removed), a one-item series as a branch becomes that item, and a parallel directly
 * inside a parallel gives its branches to the outer one. Meaning is unchanged: these are the
 * identities `a AND (b AND c) = a AND b AND c`, `(a) = a`, `a OR (b OR c) = a OR b OR c`.
 * Returns the very same object when the network is already normal.
 *
 * `keepEmpty` names empty series an edit must not sweep away: a branch the student has just drawn
 * and not filled yet is work in progress, and deleting an element beside it must leave it there.
 */
import type { NetworkNode, Parallel, Series } from './schema';

function sameList(a: readonly NetworkNode[], b: readonly NetworkNode[]): boolean {
  return a.length === b.length && a.every((node, index) => node === b[index]);
}

type Keep = ReadonlySet<string>;
const KEEP_NONE: Keep = new Set();

function normalizeSeries(series: Series, keep: Keep): Series {
  const items = series.items.flatMap((child): NetworkNode[] => {
    const node = normalizeNode(child, keep);
    if (node.kind === 'series') return node.items;
    if (node.kind === 'parallel') {
      if (node.branches.length === 0) return [];
      if (node.branches.length === 1) {
        const only = node.branches[0]!;
        return only.kind === 'series' ? only.items : [only];
      }
    }
    return [node];
  });
  return sameList(items, series.items) ? series : { ...series, items };
}

function normalizeParallel(parallel: Parallel, keep: Keep): Parallel {
  const branches = parallel.branches.flatMap((child): NetworkNode[] => {
    const node = normalizeNode(child, keep);
    if (node.kind === 'series') {
      if (node.items.length === 0) return keep.has(node.id) ? [node] : [];
      if (node.items.length === 1) {
        const only = node.items[0]!;
        return only.kind === 'parallel' ? only.branches : [only];
      }
      return [node];
    }
    if (node.kind === 'parallel') return node.branches;
    return [node];
  });
  return sameList(branches, parallel.branches) ? parallel : { ...parallel, branches };
}

function normalizeNode(node: NetworkNode, keep: Keep): NetworkNode {
  if (node.kind === 'series') return normalizeSeries(node, keep);
  if (node.kind === 'parallel') return normalizeParallel(node, keep);
  return node;
}

/**
 * Bring a rung's root series into normal form (the root stays a series with its id). Empty
 * branch series whose ids are in `keepEmpty` stay; a parallel left with only one branch still
 * collapses, even an empty kept one.
 */
export function normalizeNetwork(root: Series, keepEmpty: Keep = KEEP_NONE): Series {
  return normalizeSeries(root, keepEmpty);
}
