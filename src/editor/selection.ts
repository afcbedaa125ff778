/**
 * What is selected in the editor: elements (one or many), whole rungs, or one drop slot (the place
 * a key press inserts at). Plain data; the editor store keeps it beside the document and the
 * history remembers it with every snapshot.
 */
import type { SlotTarget } from './layoutTypes';

/** The kinds of thing the selection can hold. */
export type SelectionKind = 'none' | 'elements' | 'rungs' | 'slot';

export type Selection =
  | { kind: 'none' }
  /** `ids` in the order they were picked; the last one is the focus the arrows move from. */
  | { kind: 'elements'; ids: readonly string[] }
  | { kind: 'rungs'; ids: readonly string[] }
  | { kind: 'slot'; slot: SlotTarget };

export const NO_SELECTION: Selection = { kind: 'none' };

export function selectElements(ids: readonly string[]): Selection {
  return ids.length === 0 ? NO_SELECTION : { kind: 'elements', ids: [...new Set(ids)] };
}

export function selectRungs(ids: readonly string[]): Selection {
  return ids.length === 0 ? NO_SELECTION : { kind: 'rungs', ids: [...new Set(ids)] };
}

export function selectSlot(slot: SlotTarget): Selection {
  return { kind: 'slot', slot };
}

/** Add an element to the selection, or take it out if it was in (Shift/Ctrl+click). */
export function toggleElement(selection: Selection, id: string): Selection {
  if (selection.kind !== 'elements') return selectElements([id]);
  if (selection.ids.includes(id)) return selectElements(selection.ids.filter((x) => x !== id));
  return selectElements([...selection.ids, id]);
}

/** Add a rung to the selection, or take it out. */
export function toggleRung(selection: Selection, id: string): Selection {
  if (selection.kind !== 'rungs') return selectRungs([id]);
  if (selection.ids.includes(id)) return selectRungs(selection.ids.filter((x) => x !== id));
  return selectRungs([...selection.ids, id]);
}

/** The selected element ids (empty unless elements are selected). */
export function selectedElementIds(selection: Selection): readonly string[] {
  return selection.kind === 'elements' ? selection.ids : [];
}

/** The selected rung ids (empty unless rungs are selected). */
export function selectedRungIds(selection: Selection): readonly string[] {
  return selection.kind === 'rungs' ? selection.ids : [];
}

/** The element the keyboard works from: the last one picked. */
export function focusElementId(selection: Selection): string | undefined {
  return selection.kind === 'elements' ? selection.ids[selection.ids.length - 1] : undefined;
}

/** Two slot targets name the same place. */
export function sameSlot(a: SlotTarget, b: SlotTarget): boolean {
  return a.rungId === b.rungId && a.index === b.index && a.path.length === b.path.length && a.path.every((v, i) => v === b.path[i]);
}

/**
 * Drop what no longer exists after an edit (an undo can remove a selected element); keep the rest.
 * `exists` answers for element and rung ids.
 */
export function pruneSelection(selection: Selection, exists: (id: string) => boolean): Selection {
  if (selection.kind === 'elements') return selectElements(selection.ids.filter(exists));
  if (selection.kind === 'rungs') return selectRungs(selection.ids.filter(exists));
  if (selection.kind === 'slot' && !exists(selection.slot.rungId)) return NO_SELECTION;
  return selection;
}
