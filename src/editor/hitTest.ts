/**
 * Pure hit-testing in program coordinates (zoom and scroll already removed): which rung, element,
 * block pin or drop slot lies under a point. The canvas asks here rather than trusting Konva's own
 * hit canvas, so the answer can be tested without a DOM.
 */
import { GUTTER_W, SLOT_CATCH_RADIUS } from './geometry';
import { rungsInBand } from './layout';
import type { DropSlot, ElementBox, ProgramLayout, RungLayout } from './layoutTypes';

/** What lies under the pointer. */
export type Hit =
  | { kind: 'element'; rungId: string; box: ElementBox }
  | { kind: 'rung-number'; rungId: string }
  | { kind: 'rung'; rungId: string }
  | { kind: 'nothing' };

/** A point in program coordinates, px. */
export interface Point {
  x: number;
  y: number;
}

/** The rung whose band contains y, or `undefined` below the last rung. */
export function rungAt(layout: ProgramLayout, y: number): RungLayout | undefined {
  return rungsInBand(layout, y, y + 1)[0];
}

/** The element whose cell contains the point, in one rung's coordinates. */
export function elementAt(rung: RungLayout, local: Point): ElementBox | undefined {
  return rung.elements.find(
    (box) => local.x >= box.x && local.x < box.x + box.width && local.y >= box.y && local.y < box.y + box.height,
  );
}

/** What the pointer is over. */
export function hitTest(layout: ProgramLayout, point: Point): Hit {
  const rung = rungAt(layout, point.y);
  if (!rung) return { kind: 'nothing' };
  const local = { x: point.x, y: point.y - rung.top };
  if (local.x < GUTTER_W) return { kind: 'rung-number', rungId: rung.rungId };
  const box = elementAt(rung, local);
  if (box) return { kind: 'element', rungId: rung.rungId, box };
  return { kind: 'rung', rungId: rung.rungId };
}

/**
 * The drop slot nearest the point within `radius` px, searching the rung under the point and its
 * neighbours (a slot near a rung's edge can be closest from the next rung's band).
 */
export function nearestSlot(layout: ProgramLayout, point: Point, radius = SLOT_CATCH_RADIUS): DropSlot | undefined {
  let best: DropSlot | undefined;
  let bestDistance = radius * radius;
  for (const rung of rungsInBand(layout, point.y - radius, point.y + radius)) {
    for (const slot of rung.slots) {
      const dx = slot.x - point.x;
      const dy = slot.y + rung.top - point.y;
      const distance = dx * dx + dy * dy;
      if (distance <= bestDistance) {
        best = slot;
        bestDistance = distance;
      }
    }
  }
  return best;
}

/** The elements whose cells intersect a rectangle (rubber-band selection), program coordinates. */
export function elementsInRect(layout: ProgramLayout, a: Point, b: Point): ElementBox[] {
  const left = Math.min(a.x, b.x);
  const right = Math.max(a.x, b.x);
  const top = Math.min(a.y, b.y);
  const bottom = Math.max(a.y, b.y);
  const found: ElementBox[] = [];
  for (const rung of rungsInBand(layout, top, bottom)) {
    for (const box of rung.elements) {
      const boxTop = box.y + rung.top;
      if (box.x < right && box.x + box.width > left && boxTop < bottom && boxTop + box.height > top) found.push(box);
    }
  }
  return found;
}
