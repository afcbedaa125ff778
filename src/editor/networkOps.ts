/**
 * The editor's gestures on a rung's network, as pure `(program, args) => program` functions built
 * on the path helpers of `shared/ladder/walk.ts`. Each returns the same program object when it
 * changes nothing, so the history records nothing. After a removal the network is tidied: an
 * emptied branch goes, and a parallel left with one branch becomes that branch's items again.
 */
import type { Element, NetworkNode, Parallel, Program, Rung, Series } from '@shared/ladder/schema';
import { findPath, getNode, isElement, replaceNode, updateNode } from '@shared/ladder/walk';
import type { SlotTarget } from './layoutTypes';

/** Replace one rung by id; same program when the rung is missing or unchanged. */
export function updateRung(program: Program, rungId: string, change: (rung: Rung) => Rung): Program {
  const index = program.rungs.findIndex((r) => r.id === rungId);
  if (index < 0) return program;
  const rung = program.rungs[index] as Rung;
  const next = change(rung);
  if (next === rung) return program;
  const rungs = program.rungs.slice();
  rungs[index] = next;
  return { ...program, rungs };
}

function withNetwork(rung: Rung, network: Series): Rung {
  return network === rung.network ? rung : { ...rung, network };
}

/**
 * Insert nodes at a drop slot. A slot beside a lone element in a parallel turns that branch into a
 * series holding the element and the new nodes; `seriesId` names that new series.
 */
export function insertAtSlot(program: Program, slot: SlotTarget, nodes: readonly NetworkNode[], seriesId: string): Program {
  if (nodes.length === 0) return program;
  return updateRung(program, slot.rungId, (rung) => {
    const target = getNode(rung.network, slot.path);
    if (!target) return rung;
    if (target.kind === 'series') {
      const index = Math.max(0, Math.min(slot.index, target.items.length));
      const items = [...target.items.slice(0, index), ...nodes, ...target.items.slice(index)];
      return withNetwork(rung, replaceNode(rung.network, slot.path, { ...target, items }));
    }
    const items = slot.index === 0 ? [...nodes, target] : [target, ...nodes];
    const series: Series = { kind: 'series', id: seriesId, items };
    return withNetwork(rung, replaceNode(rung.network, slot.path, series));
  });
}

/** Tidy a network after a removal (see the module comment). */
export function normaliseNetwork(root: Series): Series {
  const tidy = (node: NetworkNode): NetworkNode[] => {
    if (isElement(node)) return [node];
    if (node.kind === 'series') {
      const items = node.items.flatMap(tidy);
      return [sameItems(items, node.items) ? node : { ...node, items }];
    }
    const branches = node.branches
      .map((b) => tidy(b))
      .map((parts): NetworkNode | null => (parts.length === 1 ? (parts[0] as NetworkNode) : null))
      .filter((b): b is NetworkNode => b !== null && !(b.kind === 'series' && b.items.length === 0));
    if (branches.length === 0) return [];
    if (branches.length === 1) {
      const only = branches[0] as NetworkNode;
      return only.kind === 'series' ? only.items : [only];
    }
    return [sameItems(branches, node.branches) ? node : { ...node, branches }];
  };
  const items = root.items.flatMap(tidy);
  return sameItems(items, root.items) ? root : { ...root, items };
}

function sameItems(a: readonly NetworkNode[], b: readonly NetworkNode[]): boolean {
  return a.length === b.length && a.every((node, i) => node === b[i]);
}

/** Remove nodes by id from every rung, then tidy each rung that changed (see `normaliseNetwork`). */
export function removeNodes(program: Program, ids: ReadonlySet<string>): Program {
  if (ids.size === 0) return program;
  let next = program;
  for (const rung of program.rungs) {
    let network = rung.network;
    for (const id of ids) {
      const path = findPath(network, id);
      if (path && path.length > 0) network = updateNode(network, path, () => null);
    }
    if (network !== rung.network) next = updateRung(next, rung.id, (r) => withNetwork(r, normaliseNetwork(network)));
  }
  return next;
}

/** The series holding a node and the node's index in it, or `null` (root, or inside a parallel directly). */
export function parentSeries(root: Series, path: readonly number[]): { path: number[]; series: Series; index: number } | null {
  if (path.length === 0) return null;
  const parentPath = path.slice(0, -1);
  const parent = getNode(root, parentPath);
  if (!parent || parent.kind !== 'series') return null;
  return { path: parentPath, series: parent, index: path[path.length - 1] as number };
}

/**
 * Wrap selected nodes of one series in a parallel branch: the run from the first to the last
 * selected item becomes the first branch, and an empty branch is added below it to draw the
 * alternative path in. Nodes in different series: nothing happens.
 */
export function wrapInParallel(program: Program, ids: readonly string[], newIds: { parallel: string; top: string; below: string }): Program {
  for (const rung of program.rungs) {
    const paths = ids.map((id) => findPath(rung.network, id)).filter((p): p is number[] => p !== null && p.length > 0);
    if (paths.length === 0) continue;
    if (paths.length !== ids.length) return program;
    const parents = paths.map((p) => parentSeries(rung.network, p));
    const first = parents[0];
    if (!first || parents.some((p) => !p || p.path.join('.') !== first.path.join('.'))) return program;
    const indexes = parents.map((p) => (p as { index: number }).index);
    const from = Math.min(...indexes);
    const to = Math.max(...indexes);
    const taken = first.series.items.slice(from, to + 1);
    const parallel: Parallel = {
      kind: 'parallel',
      id: newIds.parallel,
      branches: [
        { kind: 'series', id: newIds.top, items: taken },
        { kind: 'series', id: newIds.below, items: [] },
      ],
    };
    const items = [...first.series.items.slice(0, from), parallel, ...first.series.items.slice(to + 1)];
    return updateRung(program, rung.id, (r) => withNetwork(r, replaceNode(r.network, first.path, { ...first.series, items })));
  }
  return program;
}

/**
 * Add an empty branch below a node. When the node is a branch of a parallel (or the only item of
 * one), the parallel gets one more branch right under it; otherwise the node is wrapped in a new
 * parallel with an empty branch below.
 */
export function addBranchBelow(program: Program, id: string, newIds: { parallel: string; top: string; below: string }): Program {
  for (const rung of program.rungs) {
    const path = findPath(rung.network, id);
    if (!path || path.length === 0) continue;
    const branchOf = enclosingBranch(rung.network, path);
    if (branchOf) {
      const { parallelPath, parallel, branchIndex } = branchOf;
      const branches = [...parallel.branches];
      branches.splice(branchIndex + 1, 0, { kind: 'series', id: newIds.below, items: [] });
      return updateRung(program, rung.id, (r) => withNetwork(r, replaceNode(r.network, parallelPath, { ...parallel, branches })));
    }
    return wrapInParallel(program, [id], newIds);
  }
  return program;
}

/** The parallel a node stands in as a whole branch (alone or as a branch series' only item). */
function enclosingBranch(root: Series, path: readonly number[]): { parallelPath: number[]; parallel: Parallel; branchIndex: number } | null {
  for (let depth = path.length - 1; depth >= 0; depth -= 1) {
    const parentPath = path.slice(0, depth);
    const parent = getNode(root, parentPath);
    if (parent?.kind === 'parallel') {
      const branch = getNode(root, path.slice(0, depth + 1));
      const isWhole = depth === path.length - 1 || (branch?.kind === 'series' && branch.items.length === 1 && depth === path.length - 2);
      return isWhole ? { parallelPath: parentPath, parallel: parent, branchIndex: path[depth] as number } : null;
    }
    if (parent?.kind === 'series' && depth < path.length - 1) return null;
  }
  return null;
}

/** Move a node one place left (-1) or right (+1) within its series; same program at either end. */
export function moveAlong(program: Program, id: string, step: -1 | 1): Program {
  for (const rung of program.rungs) {
    const path = findPath(rung.network, id);
    if (!path) continue;
    const parent = parentSeries(rung.network, path);
    if (!parent) return program;
    const to = parent.index + step;
    if (to < 0 || to >= parent.series.items.length) return program;
    const items = parent.series.items.slice();
    [items[parent.index], items[to]] = [items[to] as NetworkNode, items[parent.index] as NetworkNode];
    return updateRung(program, rung.id, (r) => withNetwork(r, replaceNode(r.network, parent.path, { ...parent.series, items })));
  }
  return program;
}

/** Change one element by id anywhere in the program; same program when `change` returns it as it was. */
export function updateElement(program: Program, id: string, change: (element: Element) => Element): Program {
  for (const rung of program.rungs) {
    const path = findPath(rung.network, id);
    if (!path) continue;
    return updateRung(program, rung.id, (r) =>
      withNetwork(
        r,
        updateNode(r.network, path, (node) => (isElement(node) ? change(node) : node)),
      ),
    );
  }
  return program;
}
