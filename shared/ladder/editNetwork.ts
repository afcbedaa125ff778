/**
 * Edits inside a rung's network, addressed by rung id and node path (see `NodePath`). Each is a
 * pure `(doc, args) => doc`: an edit that changes nothing, or whose arguments do not fit the
 * document (a missing rung, a path that leads nowhere, an invalid element), returns the same
 * document object, so a user's action never throws.
 */
import { admitElement, idsOf, updateRung } from './editCore';
import { ID_PREFIX } from './ids';
import { normalizeNetwork } from './normalize';
import type { NetworkNode, NodePath, Parallel, Program, Series } from './schema';
import { outputTailStart } from './shape';
import { childrenOf, getNode, isElement, updateNode, withChildren } from './walk';

/** Arguments naming one node of one rung. */
export interface NodeTarget {
  rungId: string;
  path: NodePath;
}

function splitPath(path: NodePath): { parentPath: number[]; index: number } | null {
  if (path.length === 0) return null;
  return { parentPath: path.slice(0, -1), index: path[path.length - 1]! };
}

function container(root: Series, parentPath: NodePath): Series | Parallel | null {
  const parent = getNode(root, parentPath);
  return parent !== undefined && !isElement(parent) ? parent : null;
}

/**
 * Insert an element before or after the node at `path`, in series with it. At the root path it
 * goes first or last in the rung; beside a branch of a parallel, that branch becomes a series.
 */
export function insertElement(
  doc: Program,
  args: NodeTarget & { position: 'before' | 'after'; element: unknown },
): Program {
  return insertElements(doc, { rungId: args.rungId, path: args.path, position: args.position, elements: [args.element] });
}

/**
 * Insert several elements, in the order given, as one run in series before or after the node at
 * `path` (a paste). Same placement as `insertElement`; when any of them is not a valid element,
 * nothing is inserted.
 */
export function insertElements(
  doc: Program,
  args: NodeTarget & { position: 'before' | 'after'; elements: readonly unknown[] },
): Program {
  return updateRung(doc, args.rungId, (rung) => {
    const ids = idsOf(doc);
    const run = args.elements.map((e) => admitElement(e, ids));
    if (run.length === 0 || run.some((e) => e === null)) return rung;
    const elements = run as NetworkNode[];
    const around = (items: readonly NetworkNode[]) => (args.position === 'before' ? [...elements, ...items] : [...items, ...elements]);
    const root = rung.network;
    const split = splitPath(args.path);
    if (split === null) return { ...rung, network: { ...root, items: around(root.items) } };
    const parent = container(root, split.parentPath);
    const target = parent ? childrenOf(parent)[split.index] : undefined;
    if (!parent || !target) return rung;
    const at = args.position === 'before' ? split.index : split.index + 1;
    if (parent.kind === 'series') {
      const items = parent.items.slice();
      items.splice(at, 0, ...elements);
      return { ...rung, network: updateNode(root, split.parentPath, () => ({ ...parent, items })) };
    }
    const branch: Series =
      target.kind === 'series' ? { ...target, items: around(target.items) } : { kind: 'series', id: ids.next(ID_PREFIX.series), items: around([target]) };
    return { ...rung, network: updateNode(root, args.path, () => branch) };
  });
}

/**
 * Add an element at the end of a rung. A coil goes last; a contact or block goes before the
 * rung's output tail (its trailing coils or final output parallel), where it can feed them.
 */
export function appendElement(doc: Program, args: { rungId: string; element: unknown }): Program {
  return updateRung(doc, args.rungId, (rung) => {
    const element = admitElement(args.element, idsOf(doc));
    if (element === null) return rung;
    const items = rung.network.items.slice();
    items.splice(element.kind === 'coil' ? items.length : outputTailStart(rung.network), 0, element);
    return { ...rung, network: { ...rung.network, items } };
  });
}

/**
 * Wrap a contiguous run of siblings of one series in a parallel: the selection becomes the first
 * branch, and the second branch is `element` when given, else an empty series to fill in.
 */
export function wrapInParallel(doc: Program, args: { rungId: string; paths: readonly NodePath[]; element?: unknown }): Program {
  return updateRung(doc, args.rungId, (rung) => {
    const splits = args.paths.map(splitPath);
    if (splits.length === 0 || splits.some((s) => s === null)) return rung;
    const parentPath = splits[0]!.parentPath;
    const sameParent = splits.every((s) => s!.parentPath.length === parentPath.length && s!.parentPath.every((v, i) => v === parentPath[i]));
    const parent = container(rung.network, parentPath);
    if (!sameParent || parent?.kind !== 'series') return rung;
    const indices = [...new Set(splits.map((s) => s!.index))].sort((a, b) => a - b);
    const first = indices[0]!;
    const last = indices[indices.length - 1]!;
    if (last - first + 1 !== indices.length || last >= parent.items.length) return rung;

    const ids = idsOf(doc);
    let second: NetworkNode | null = null;
    if (args.element !== undefined) {
      second = admitElement(args.element, ids);
      if (second === null) return rung;
    }
    const selection = parent.items.slice(first, last + 1);
    const firstBranch: NetworkNode =
      selection.length === 1 ? selection[0]! : { kind: 'series', id: ids.next(ID_PREFIX.series), items: selection };
    const secondBranch: NetworkNode = second ?? { kind: 'series', id: ids.next(ID_PREFIX.series), items: [] };
    const parallel: Parallel = { kind: 'parallel', id: ids.next(ID_PREFIX.parallel), branches: [firstBranch, secondBranch] };
    const items = parent.items.slice();
    items.splice(first, selection.length, parallel);
    return { ...rung, network: updateNode(rung.network, parentPath, () => ({ ...parent, items })) };
  });
}

/**
 * Add a branch holding `element` below the node at `path`: a new last branch when the node is a
 * parallel, a new branch right under it when it is a branch, else the node and the element become
 * the two branches of a new parallel. Without `element` the new branch is an empty series, for the
 * editor to draw the alternative path in (as `wrapInParallel` does).
 */
export function addBranchBelow(doc: Program, args: NodeTarget & { element?: unknown }): Program {
  return updateRung(doc, args.rungId, (rung) => {
    const split = splitPath(args.path);
    const node = getNode(rung.network, args.path);
    if (split === null || node === undefined) return rung;
    const ids = idsOf(doc);
    const element = args.element === undefined ? null : admitElement(args.element, ids);
    if (args.element !== undefined && element === null) return rung;
    const branch: NetworkNode = element ?? { kind: 'series', id: ids.next(ID_PREFIX.series), items: [] };
    if (node.kind === 'parallel') {
      return { ...rung, network: updateNode(rung.network, args.path, () => ({ ...node, branches: [...node.branches, branch] })) };
    }
    const parent = container(rung.network, split.parentPath);
    if (parent === null) return rung;
    if (parent.kind === 'parallel') {
      const branches = parent.branches.slice();
      branches.splice(split.index + 1, 0, branch);
      return { ...rung, network: updateNode(rung.network, split.parentPath, () => ({ ...parent, branches })) };
    }
    const parallel: Parallel = { kind: 'parallel', id: ids.next(ID_PREFIX.parallel), branches: [node, branch] };
    return { ...rung, network: updateNode(rung.network, args.path, () => parallel) };
  });
}

function compareReverse(a: NodePath, b: NodePath): number {
  for (let i = 0; i < Math.min(a.length, b.length); i += 1) {
    if (a[i] !== b[i]) return b[i]! - a[i]!;
  }
  return b.length - a.length;
}

/** Ids of the empty series standing as branches of a parallel: branches drawn and not filled yet. */
function emptyBranchIds(root: Series): Set<string> {
  const found = new Set<string>();
  const visit = (node: NetworkNode): void => {
    if (node.kind === 'series') node.items.forEach(visit);
    else if (node.kind === 'parallel') {
      for (const branch of node.branches) {
        if (branch.kind === 'series' && branch.items.length === 0) found.add(branch.id);
        visit(branch);
      }
    }
  };
  visit(root);
  return found;
}

/**
 * Delete the nodes at `paths` (the root cannot be deleted), then normalise the network: a
 * parallel left with one branch collapses, series the deletion emptied inside a parallel go,
 * nested series flatten (see `normalizeNetwork`). A branch that was already empty (drawn, not
 * filled yet) stays: deleting an element beside it is not a request to delete it.
 */
export function deleteNodes(doc: Program, args: { rungId: string; paths: readonly NodePath[] }): Program {
  return updateRung(doc, args.rungId, (rung) => {
    const valid = args.paths.filter((p) => p.length > 0 && getNode(rung.network, p) !== undefined);
    if (valid.length === 0) return rung;
    const unique = [...new Map(valid.map((p) => [p.join('.'), p])).values()].sort(compareReverse);
    const keep = emptyBranchIds(rung.network);
    let network = rung.network;
    for (const path of unique) network = updateNode(network, path, () => null);
    return { ...rung, network: normalizeNetwork(network, keep) };
  });
}

/** Move a node one place left/up (`-1`) or right/down (`1`) among its siblings. */
export function moveElement(doc: Program, args: NodeTarget & { offset: -1 | 1 }): Program {
  return updateRung(doc, args.rungId, (rung) => {
    const split = splitPath(args.path);
    if (split === null || (args.offset !== -1 && args.offset !== 1)) return rung;
    const parent = container(rung.network, split.parentPath);
    if (parent === null) return rung;
    const children = childrenOf(parent).slice();
    const target = split.index + args.offset;
    if (split.index >= children.length || target < 0 || target >= children.length) return rung;
    [children[split.index], children[target]] = [children[target]!, children[split.index]!];
    return { ...rung, network: updateNode(rung.network, split.parentPath, () => withChildren(parent, children)) };
  });
}
