/**
 * The editor's gestures expressed as the shared edits (`shared/ladder/edits.ts`). The editor
 * selects by element id and drop slot; the shared edits address nodes by rung id and path. This
 * module only translates one into the other (and reports the ids a gesture created, so the editor
 * can select them); every change to the document is made by a shared edit. Each function returns
 * the same document when nothing changes, so the history records nothing.
 */
import { idsOf, withFreshIds } from '@shared/ladder/editCore';
import {
  addBranchBelow,
  addRung,
  deleteNodes,
  deleteRung,
  insertElements,
  moveElement,
  wrapInParallel,
} from '@shared/ladder/edits';
import { ID_PREFIX } from '@shared/ladder/ids';
import type { Element, NodePath, Program, Rung } from '@shared/ladder/schema';
import { allIds, findPath, getNode, visitNodes } from '@shared/ladder/walk';
import type { SlotTarget } from './layoutTypes';
import { slotInsertTarget } from './slots';

/** Where an element sits: its rung and path, or `null` when no rung holds it. */
function locate(doc: Program, id: string): { rungId: string; path: NodePath } | null {
  for (const rung of doc.rungs) {
    const path = findPath(rung.network, id);
    if (path && path.length > 0) return { rungId: rung.id, path };
  }
  return null;
}

/** Element ids grouped by the rung holding them, as paths. */
function pathsByRung(doc: Program, ids: readonly string[]): Map<string, NodePath[]> {
  const byRung = new Map<string, NodePath[]>();
  for (const id of ids) {
    const at = locate(doc, id);
    if (at) byRung.set(at.rungId, [...(byRung.get(at.rungId) ?? []), at.path]);
  }
  return byRung;
}

/** Insert elements, in order, at a drop slot (see `slotInsertTarget` for what a slot means). */
export function insertAtSlot(doc: Program, slot: SlotTarget, elements: readonly Element[]): Program {
  const target = slotInsertTarget(doc, slot);
  return target ? insertElements(doc, { ...target, elements }) : doc;
}

/** Delete elements by id, in whichever rungs hold them; each rung is then normalised by the shared edit. */
export function deleteElements(doc: Program, ids: readonly string[]): Program {
  let next = doc;
  for (const [rungId, paths] of pathsByRung(doc, ids)) next = deleteNodes(next, { rungId, paths });
  return next;
}

/**
 * The drop slot of the empty branch an edit just drew in `rungId` (one that is in `after` and was
 * not in `before`), so the next key or palette click fills that branch instead of going on in series.
 */
export function newEmptyBranchSlot(before: Program, after: Program, rungId: string): SlotTarget | undefined {
  if (before === after) return undefined;
  const rung = after.rungs.find((r) => r.id === rungId);
  if (!rung) return undefined;
  const old = new Set(allIds(before));
  let found: SlotTarget | undefined;
  visitNodes(rung.network, (node, path) => {
    if (found === undefined && node.kind === 'series' && node.items.length === 0 && path.length > 0 && !old.has(node.id)) found = { rungId, path, index: 0 };
  });
  return found;
}

/** The rung holding an element, by id. */
export function rungOfElement(doc: Program, id: string): string | undefined {
  return locate(doc, id)?.rungId;
}

/** Wrap selected sibling elements of one series in a parallel with an empty branch below; elsewhere nothing. */
export function wrapElements(doc: Program, ids: readonly string[]): Program {
  const byRung = pathsByRung(doc, ids);
  const [only] = byRung;
  if (byRung.size !== 1 || !only || only[1].length !== ids.length) return doc;
  return wrapInParallel(doc, { rungId: only[0], paths: only[1] });
}

/**
 * Add an empty branch below an element. An element standing alone in a branch series of a
 * parallel stands for that branch: the new branch goes right under it in the same parallel,
 * rather than in a parallel nested inside the branch.
 */
export function addBranchUnder(doc: Program, id: string): Program {
  const at = locate(doc, id);
  if (!at) return doc;
  const rung = doc.rungs.find((r) => r.id === at.rungId) as Rung;
  const parentPath = at.path.slice(0, -1);
  const parent = getNode(rung.network, parentPath);
  const grandparent = parentPath.length > 0 ? getNode(rung.network, parentPath.slice(0, -1)) : undefined;
  const wholeBranch = parent?.kind === 'series' && parent.items.length === 1 && grandparent?.kind === 'parallel';
  return addBranchBelow(doc, { rungId: at.rungId, path: wholeBranch ? parentPath : at.path });
}

/** Move an element one place left (-1) or right (+1) among its siblings. */
export function moveElementBy(doc: Program, id: string, offset: -1 | 1): Program {
  const at = locate(doc, id);
  return at ? moveElement(doc, { ...at, offset }) : doc;
}

/** Delete rungs by id. */
export function deleteRungs(doc: Program, ids: readonly string[]): Program {
  return ids.reduce((next, rungId) => deleteRung(next, { rungId }), doc);
}

/** The rung id a new rung at position `at` (0 = top) goes after: `null` for the top, clamped to the end. */
function afterRungIdFor(doc: Program, at: number): string | null {
  const index = Math.min(at, doc.rungs.length) - 1;
  return index < 0 ? null : (doc.rungs[index] as Rung).id;
}

/** Add an empty rung at position `at`; gives the new rung's id (`null` when the program is full). */
export function addEmptyRung(doc: Program, at: number): { doc: Program; rungId: string | null } {
  const next = addRung(doc, { afterRungId: afterRungIdFor(doc, at) });
  const index = Math.max(0, Math.min(at, doc.rungs.length));
  return { doc: next, rungId: next === doc ? null : (next.rungs[index] as Rung).id };
}

/** Paste copies of rungs at position `at`, with fresh ids for every rung and node; gives the new rung ids. */
export function pasteRungs(doc: Program, at: number, rungs: readonly Rung[]): { doc: Program; rungIds: string[] } {
  const ids = idsOf(doc);
  const copies = rungs.map((r): Rung => ({ ...r, id: ids.next(ID_PREFIX.rung), network: withFreshIds(r.network, ids) }));
  let next = doc;
  let after = afterRungIdFor(doc, at);
  const rungIds: string[] = [];
  for (const copy of copies) {
    const added = addRung(next, { afterRungId: after, rung: copy });
    if (added === next) break;
    next = added;
    after = copy.id;
    rungIds.push(copy.id);
  }
  return { doc: next, rungIds };
}

/** Copies of elements with fresh ids unused in `doc`, for a paste (the ids are then selected). */
export function freshCopies(doc: Program, elements: readonly Element[]): Element[] {
  const ids = idsOf(doc);
  return elements.map((e) => withFreshIds(e, ids));
}

/** A fresh id unused in `doc` for a new element of this kind. */
export function freshElementId(doc: Program, kind: Element['kind']): string {
  return idsOf(doc).next(ID_PREFIX[kind]);
}
