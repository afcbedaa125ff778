/**
 * Keyboard navigation over the drawing: the arrow keys move between "stops" — elements and the drop
 * slots between them — by position on the canvas, so the keys follow what the eye sees (left/right
 * along a wire, up/down between branches and rungs). Pure, over a `ProgramLayout`.
 */
import type { ProgramLayout, SlotTarget } from './layoutTypes';
import { sameSlot, selectElements, selectSlot, type Selection } from './selection';

export type Direction = 'left' | 'right' | 'up' | 'down';

/** A place the keyboard can stand on, with its position in program coordinates. */
interface Stop {
  selection: Selection;
  rungIndex: number;
  x: number;
  y: number;
}

function stopsOf(layout: ProgramLayout, rungIndexes: readonly number[]): Stop[] {
  const stops: Stop[] = [];
  for (const index of rungIndexes) {
    const rung = layout.rungs[index];
    if (!rung) continue;
    for (const box of rung.elements) {
      stops.push({ selection: selectElements([box.id]), rungIndex: index, x: box.x + box.width / 2, y: rung.top + box.wireY });
    }
    for (const slot of rung.slots) {
      stops.push({ selection: selectSlot(slot.target), rungIndex: index, x: slot.x, y: rung.top + slot.y });
    }
  }
  return stops;
}

/** Where the current selection stands, or `undefined` when it stands nowhere on the canvas. */
function currentStop(layout: ProgramLayout, selection: Selection): Stop | undefined {
  if (selection.kind === 'elements') {
    const id = selection.ids[selection.ids.length - 1];
    for (const rung of layout.rungs) {
      const box = rung.elements.find((b) => b.id === id);
      if (box) return { selection, rungIndex: rung.index, x: box.x + box.width / 2, y: rung.top + box.wireY };
    }
  }
  if (selection.kind === 'slot') return slotStop(layout, selection.slot);
  if (selection.kind === 'rungs') {
    const rung = layout.rungs.find((r) => r.rungId === selection.ids[selection.ids.length - 1]);
    if (rung) return { selection, rungIndex: rung.index, x: 0, y: rung.top + rung.wireY };
  }
  return undefined;
}

function slotStop(layout: ProgramLayout, target: SlotTarget): Stop | undefined {
  const rung = layout.rungs.find((r) => r.rungId === target.rungId);
  const slot = rung?.slots.find((s) => sameSlot(s.target, target));
  if (!rung || !slot) return undefined;
  return { selection: selectSlot(slot.target), rungIndex: rung.index, x: slot.x, y: rung.top + slot.y };
}

/** The first stop of the program (its first rung's first slot), for a selection that is empty. */
export function firstStop(layout: ProgramLayout): Selection | undefined {
  const rung = layout.rungs[0];
  const slot = rung?.slots[0];
  return slot ? selectSlot(slot.target) : undefined;
}

/** How far a candidate is from `from` going in `direction`; `undefined` when it lies the other way. */
function distance(from: Stop, to: Stop, direction: Direction): number | undefined {
  const dx = to.x - from.x;
  const dy = to.y - from.y;
  switch (direction) {
    case 'right':
      return dx > 0.5 && to.rungIndex === from.rungIndex ? dx + 4 * Math.abs(dy) : undefined;
    case 'left':
      return dx < -0.5 && to.rungIndex === from.rungIndex ? -dx + 4 * Math.abs(dy) : undefined;
    case 'down':
      return dy > 0.5 ? dy + 2 * Math.abs(dx) : undefined;
    case 'up':
      return dy < -0.5 ? -dy + 2 * Math.abs(dx) : undefined;
  }
}

/**
 * The selection after pressing an arrow key: the nearest stop in that direction. Left and right stay
 * within the rung; up and down may cross into the rung above or below. The same selection when
 * there is nowhere to go.
 */
export function moveSelection(layout: ProgramLayout, selection: Selection, direction: Direction): Selection {
  const from = currentStop(layout, selection);
  if (!from) return firstStop(layout) ?? selection;
  const neighbours = [from.rungIndex - 1, from.rungIndex, from.rungIndex + 1];
  let best: Stop | undefined;
  let bestDistance = Infinity;
  for (const stop of stopsOf(layout, neighbours)) {
    const d = distance(from, stop, direction);
    if (d !== undefined && d < bestDistance) {
      best = stop;
      bestDistance = d;
    }
  }
  return best ? best.selection : selection;
}
