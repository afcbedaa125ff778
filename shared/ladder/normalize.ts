/**
 * Normal form of a network: no series directly inside a series (flattened), no parallel with a
 * single branch (it becomes its branch), no empty series inside a parallel and no parallel with no
 * branches (removed), a one-item series as a branch becomes that item, and a parallel directly
 * inside a parallel gives its branches to the outer one. Meaning is unchanged: these are the
 * identities `a AND (b AND c) = a AND b AND c`, `(a) = a`, `a OR (b OR c) = a OR b OR c`.
 * Returns the very same object when the network is already normal.
 */
import type { NetworkNode, Parallel, Series } from './schema';

function sameList(a: readonly NetworkNode[], b: readonly NetworkNode[]): boolean {
  return a.length === b.length && a.every((node, index) => node === b[index]);
}

function normalizeSeries(series: Series): Series {
  const items = series.items.flatMap((child): NetworkNode[] => {
    const node = normalizeNode(child);
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

function normalizeParallel(parallel: Parallel): Parallel {
  const branches = parallel.branches.flatMap((child): NetworkNode[] => {
    const node = normalizeNode(child);
    if (node.kind === 'series') {
      if (node.items.length === 0) return [];
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

function normalizeNode(node: NetworkNode): NetworkNode {
  if (node.kind === 'series') return normalizeSeries(node);
  if (node.kind === 'parallel') return normalizeParallel(node);
  return node;
}

/** Bring a rung's root series into normal form (the root stays a series with its id). */
export function normalizeNetwork(root: Series): Series {
  return normalizeSeries(root);
}
