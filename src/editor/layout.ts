/**
 * The layout function: a program document in, a drawing out. Rungs are stacked top to bottom, all
 * sharing one right rail placed past the widest rung, so coils line up down the page. Nothing is
 * stored: the canvas calls this again after every edit (it costs well under a millisecond a rung).
 */
import type { Program, Rung, Tag } from '@shared/ladder/schema';
import {
  GUTTER_W,
  LEAD_W,
  LEFT_RAIL_X,
  MIN_RUNG_W,
  RAIL_W,
  RUNG_COMMENT_H,
  RUNG_PAD_BOTTOM,
  RUNG_PAD_TOP,
  RUNG_TEXT_H,
  WIRE_Y,
} from './geometry';
import { measureNode, placeNetwork } from './layoutNetwork';
import type { LayoutOptions, ProgramLayout, RungLayout } from './layoutTypes';

/** Where the root series of every rung begins. */
export const NETWORK_X = LEFT_RAIL_X + RAIL_W + LEAD_W;

/**
 * Declared tag name → address, the lookup the labels above operands need. Tag names are
 * case-insensitive (IEC 61131-3 identifiers), so `operandLabel` compares them in upper case.
 */
export function tagAddressMap(tags: readonly Tag[]): Map<string, string> {
  return new Map(tags.map((tag) => [tag.name, tag.address]));
}

/** The x of the right rail for a program: past its widest rung, never closer than `MIN_RUNG_W`. */
export function rightRailX(rungs: readonly Rung[]): number {
  let widest = 0;
  for (const rung of rungs) widest = Math.max(widest, measureNode(rung.network).width);
  return Math.max(LEFT_RAIL_X + MIN_RUNG_W, NETWORK_X + widest + LEAD_W);
}

/** Lay out one rung at vertical offset `top`, with the right rail at `railX`. */
export function layoutRung(rung: Rung, index: number, top: number, railX: number, options: LayoutOptions): RungLayout {
  const commentH = rung.comment.trim() === '' ? 0 : RUNG_COMMENT_H;
  const networkTop = RUNG_PAD_TOP + commentH;
  const { height: networkH } = measureNode(rung.network);
  const networkRight = railX - LEAD_W;
  const drawing = placeNetwork(rung.id, rung.network, NETWORK_X, networkTop, networkRight - NETWORK_X, options);
  const wireY = networkTop + WIRE_Y;
  // Lead-in from the left rail and lead-out to the right rail.
  drawing.wires.unshift({ x1: LEFT_RAIL_X + RAIL_W, y1: wireY, x2: NETWORK_X, y2: wireY });
  drawing.wires.push({ x1: networkRight, y1: wireY, x2: railX, y2: wireY });
  const text = options.rungText?.get(rung.id) ?? null;
  const networkBottom = networkTop + networkH;
  const height = networkBottom + (text === null ? 0 : RUNG_TEXT_H) + RUNG_PAD_BOTTOM;
  return {
    rungId: rung.id,
    index,
    top,
    height,
    networkTop,
    networkBottom,
    wireY,
    comment: rung.comment,
    text,
    ...drawing,
  };
}

/** Lay out the whole program. */
export function layoutProgram(program: Pick<Program, 'rungs' | 'tags'>, rungText?: ReadonlyMap<string, string>): ProgramLayout {
  const options: LayoutOptions = { tagAddresses: tagAddressMap(program.tags), rungText };
  const railX = rightRailX(program.rungs);
  const rungs: RungLayout[] = [];
  let top = 0;
  program.rungs.forEach((rung, index) => {
    const rungLayout = layoutRung(rung, index, top, railX, options);
    rungs.push(rungLayout);
    top += rungLayout.height;
  });
  return { width: railX + RAIL_W + GUTTER_W / 2, height: top, leftRailX: LEFT_RAIL_X, rightRailX: railX, rungs };
}

/** The rungs that overlap the band [top, bottom) of the program, by binary search over `top`. */
export function rungsInBand(layout: ProgramLayout, top: number, bottom: number): RungLayout[] {
  const { rungs } = layout;
  let lo = 0;
  let hi = rungs.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    const rung = rungs[mid] as RungLayout;
    if (rung.top + rung.height <= top) lo = mid + 1;
    else hi = mid;
  }
  const visible: RungLayout[] = [];
  for (let i = lo; i < rungs.length; i += 1) {
    const rung = rungs[i] as RungLayout;
    if (rung.top >= bottom) break;
    visible.push(rung);
  }
  return visible;
}
