/**
 * Where an insertion goes when no drop slot is selected: right after the focused element, or, for a
 * selected rung, before its coils (a contact) or at its end (a coil or block). Pure, over the
 * document.
 */
import type { Program } from '@shared/ladder/schema';
import { findPath, getNode } from '@shared/ladder/walk';
import type { SlotTarget } from './layoutTypes';
import { outputTailStart } from './layoutNetwork';
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
