/**
 * The layout function: a program document in, a drawing out. Rungs are stacked top to bottom, all
 * sharing one right rail placed past the widest rung, so coils line up down the page. Nothing is
 * stored: the canvas calls this again after every edit (it costs well under a millisecond a rung).
 *
 * A rung's place and size are worked out at once (they come from measuring its network), its
 * drawing (element boxes, wires, drop slots) the first time something reads it: the canvas reads
 * only the rungs in view, so opening a 200-rung program places the dozen on screen, not all 200,
 * before its first paint. Whoever reads a rung's drawing later gets the same drawing.
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
import { measureNode, placeNetwork, type NetworkDrawing, type Size } from './layoutNetwork';
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

/** The x of the right rail past networks `widest` px wide, never closer than `MIN_RUNG_W`. */
function railPast(widest: number): number {
  return Math.max(LEFT_RAIL_X + MIN_RUNG_W, NETWORK_X + widest + LEAD_W);
}

/** The x of the right rail for a program: past its widest rung, never closer than `MIN_RUNG_W`. */
export function rightRailX(rungs: readonly Rung[]): number {
  let widest = 0;
  for (const rung of rungs) widest = Math.max(widest, measureNode(rung.network).width);
  return railPast(widest);
}

/**
 * Lay out one rung at vertical offset `top`, with the right rail at `railX`; `networkSize` is its
 * network's measure when the caller has it already. Its drawing is placed when first read.
 */
export function layoutRung(rung: Rung, index: number, top: number, railX: number, options: LayoutOptions, networkSize: Size = measureNode(rung.network)): RungLayout {
  const commentH = rung.comment.trim() === '' ? 0 : RUNG_COMMENT_H;
  const networkTop = RUNG_PAD_TOP + commentH;
  const networkRight = railX - LEAD_W;
  const wireY = networkTop + WIRE_Y;
  let drawing: NetworkDrawing | null = null;
  const placed = (): NetworkDrawing => {
    if (drawing) return drawing;
    drawing = placeNetwork(rung.id, rung.network, NETWORK_X, networkTop, networkRight - NETWORK_X, options);
    // Lead-in from the left rail and lead-out to the right rail.
    drawing.wires.unshift({ x1: LEFT_RAIL_X + RAIL_W, y1: wireY, x2: NETWORK_X, y2: wireY });
    drawing.wires.push({ x1: networkRight, y1: wireY, x2: railX, y2: wireY });
    return drawing;
  };
  const text = options.rungText?.get(rung.id) ?? null;
  const networkBottom = networkTop + networkSize.height;
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
    get elements() {
      return placed().elements;
    },
    get wires() {
      return placed().wires;
    },
    get slots() {
      return placed().slots;
    },
  };
}

/** Lay out the whole program (each rung's drawing placed when first read: see the top of this file). */
export function layoutProgram(program: Pick<Program, 'rungs' | 'tags'>, rungText?: ReadonlyMap<string, string>): ProgramLayout {
  const options: LayoutOptions = { tagAddresses: tagAddressMap(program.tags), rungText };
  const sizes = program.rungs.map((rung) => measureNode(rung.network));
  const railX = railPast(sizes.reduce((widest, size) => Math.max(widest, size.width), 0));
  const rungs: RungLayout[] = [];
  let top = 0;
  program.rungs.forEach((rung, index) => {
    const rungLayout = layoutRung(rung, index, top, railX, options, sizes[index]);
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
