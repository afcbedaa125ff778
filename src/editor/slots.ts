/**
 * Where an insertion goes when no drop slot is selected: right after the focused element, or, for a
 * selected rung, before its coils (a contact) or at its end (a coil or block); and how a slot
 * maps onto the node target of the shared `insertElements` edit. Pure, over the document.
 */
import type { NodeTarget } from '@shared/ladder/edits';
import type { Program } from '@shared/ladder/schema';
import { outputTailStart } from '@shared/ladder/shape';
import { findPath, getNode, isElement } from '@shared/ladder/walk';
import type { SlotTarget } from './layoutTypes';
import type { PaletteItem } from './palette';
import { focusElementId, type Selection } from './selection';

/** The slot right after an element, in its series, or beside it when it stands alone as a branch. */
export function slotAfter(program: Program, elementId: string): SlotTarget | undefined {
  for (const rung of program.rungs) {
    const path = findPath(rung.network, elementId);
    if (!path || path.length === 0) continue;
    const parentPath = path.slice(0, -1);
    const parent = getNode(rung.network, parentPath);
    const index = path[path.length - 1] as number;
    if (parent?.kind === 'series') return { rungId: rung.id, path: parentPath, index: index + 1 };
    return { rungId: rung.id, path, index: 1 };
  }
  return undefined;
}

/** The slot a new item of this kind takes in a rung when only the rung is chosen. */
export function slotInRung(program: Program, rungId: string, item: PaletteItem): SlotTarget | undefined {
  const rung = program.rungs.find((r) => r.id === rungId);
  if (!rung) return undefined;
  const index = item.kind === 'contact' ? outputTailStart(rung.network) : rung.network.items.length;
  return { rungId, path: [], index };
}

/** Where an insertion of `item` goes for the current selection, or `undefined` when nowhere. */
export function insertionSlot(program: Program, selection: Selection, item: PaletteItem): SlotTarget | undefined {
  if (selection.kind === 'slot') return selection.slot;
  const focus = focusElementId(selection);
  if (focus !== undefined) return slotAfter(program, focus);
  if (selection.kind === 'rungs') {
    const last = selection.ids[selection.ids.length - 1];
    return last === undefined ? undefined : slotInRung(program, last, item);
  }
  const lastRung = program.rungs[program.rungs.length - 1];
  return lastRung ? slotInRung(program, lastRung.id, item) : undefined;
}

/** The rung a selection belongs to (for rung commands on an element or slot selection). */
export function selectionRungId(program: Program, selection: Selection): string | undefined {
  if (selection.kind === 'rungs') return selection.ids[selection.ids.length - 1];
  if (selection.kind === 'slot') return selection.slot.rungId;
  const focus = focusElementId(selection);
  if (focus === undefined) return undefined;
  return program.rungs.find((r) => findPath(r.network, focus) !== null)?.id;
}

/**
 * The shared `insertElements` target for a drop slot. A slot is a gap in a series (`path` names
 * the series, `index` the gap: 0 before the first item) or the wire beside an element standing
 * alone as a branch of a parallel (`path` names the element, `index` 0 before it, else after).
 * An empty series is filled from its start. `undefined` when the slot leads nowhere.
 */
export function slotInsertTarget(program: Program, slot: SlotTarget): (NodeTarget & { position: 'before' | 'after' }) | undefined {
  const rung = program.rungs.find((r) => r.id === slot.rungId);
  const node = rung ? getNode(rung.network, slot.path) : undefined;
  if (!node) return undefined;
  if (isElement(node)) return { rungId: slot.rungId, path: slot.path, position: slot.index === 0 ? 'before' : 'after' };
  if (node.kind !== 'series') return undefined;
  if (node.items.length === 0) return { rungId: slot.rungId, path: slot.path, position: 'before' };
  const gap = Math.max(0, Math.min(slot.index, node.items.length));
  return gap === 0
    ? { rungId: slot.rungId, path: [...slot.path, 0], position: 'before' }
    : { rungId: slot.rungId, path: [...slot.path, gap - 1], position: 'after' };
}
