/**
 * What to paint for a rung, as a flat list of primitives (lines, arcs, boxes, text) computed from
 * its layout. Pure and tested; the canvas paints the list and decides nothing. The symbols are the
 * IEC 61131-3 graphic symbols: `| |` `|/|` `|P|` `|N|` for contacts, `( )` `(/)` `(S)` `(R)` for
 * coils, a box with its formal parameters for a function block.
 */
import type { CoilVariant, ContactVariant } from '@shared/ladder/schema';
import { BLOCK_BOX_LEFT, BLOCK_BOX_W, BLOCK_HEAD, BLOCK_FOOT, GUTTER_W, LEFT_RAIL_X, NETWORK_TEXT_X, RAIL_W, RUNG_PAD_TOP, SYMBOL_HALF_H, SYMBOL_HALF_W } from './geometry';
import type { ElementBox, ProgramLayout, RungLayout } from './layoutTypes';

/** Which colour of the palette a primitive takes (`theme.ts` maps them to values). */
export type InkRole = 'ink' | 'muted' | 'label' | 'paper';
export type FontRole = 'ui' | 'uiStrong' | 'mono' | 'note';

export type DrawOp =
  | { op: 'line'; points: number[]; ink: InkRole; width: number }
  | { op: 'arc'; x: number; y: number; r: number; from: number; to: number; ink: InkRole; width: number }
  | { op: 'rect'; x: number; y: number; w: number; h: number; ink: InkRole; width: number; fill: InkRole | null }
  | { op: 'text'; x: number; y: number; text: string; font: FontRole; size: number; ink: InkRole; align: 'left' | 'center' | 'right'; maxWidth: number };

const DEG = Math.PI / 180;
/** The coil's brackets are arcs of this radius, centred off the symbol so they bow outwards. */
const COIL_ARC_R = 22;
const COIL_ARC_SPAN = 35 * DEG;

const line = (points: number[], ink: InkRole = 'ink', width = 2): DrawOp => ({ op: 'line', points, ink, width });
const text = (x: number, y: number, value: string, font: FontRole, size: number, ink: InkRole, align: 'left' | 'center' | 'right', maxWidth: number): DrawOp => ({
  op: 'text',
  x,
  y,
  text: value,
  font,
  size,
  ink,
  align,
  maxWidth,
});

/** The letter written inside a contact or coil symbol, if any. */
const CONTACT_MARK = { no: '', nc: '/', rising: 'P', falling: 'N' } as const satisfies Record<ContactVariant, string>;
const COIL_MARK = { coil: '', negated: '/', set: 'S', reset: 'R', positive: 'P', negative: 'N' } as const satisfies Record<CoilVariant, string>;

function contactOps(cx: number, wy: number, variant: ContactVariant): DrawOp[] {
  const ops = [
    line([cx - SYMBOL_HALF_W, wy - SYMBOL_HALF_H, cx - SYMBOL_HALF_W, wy + SYMBOL_HALF_H]),
    line([cx + SYMBOL_HALF_W, wy - SYMBOL_HALF_H, cx + SYMBOL_HALF_W, wy + SYMBOL_HALF_H]),
  ];
  const mark = CONTACT_MARK[variant];
  if (mark === '/') ops.push(line([cx - 8, wy + 10, cx + 8, wy - 10], 'ink', 1.6));
  else if (mark !== '') ops.push(text(cx, wy - 7, mark, 'uiStrong', 13, 'ink', 'center', 20));
  return ops;
}

function coilOps(cx: number, wy: number, variant: CoilVariant): DrawOp[] {
  const offset = COIL_ARC_R - SYMBOL_HALF_W;
  const ops: DrawOp[] = [
    { op: 'arc', x: cx + offset, y: wy, r: COIL_ARC_R, from: 180 * DEG - COIL_ARC_SPAN, to: 180 * DEG + COIL_ARC_SPAN, ink: 'ink', width: 2 },
    { op: 'arc', x: cx - offset, y: wy, r: COIL_ARC_R, from: -COIL_ARC_SPAN, to: COIL_ARC_SPAN, ink: 'ink', width: 2 },
  ];
  const mark = COIL_MARK[variant];
  if (mark === '/') ops.push(line([cx - 6, wy + 9, cx + 6, wy - 9], 'ink', 1.6));
  else if (mark !== '') ops.push(text(cx, wy - 7, mark, 'uiStrong', 13, 'ink', 'center', 20));
  return ops;
}

function blockOps(box: ElementBox): DrawOp[] {
  if (box.element.kind !== 'block') return [];
  const left = box.x + BLOCK_BOX_LEFT;
  const right = left + BLOCK_BOX_W;
  const lastPin = Math.max(...box.pins.map((p) => p.y));
  const top = box.wireY - BLOCK_HEAD;
  const ops: DrawOp[] = [
    { op: 'rect', x: left, y: top, w: BLOCK_BOX_W, h: lastPin + BLOCK_FOOT - top, ink: 'ink', width: 2, fill: 'paper' },
    text(left + BLOCK_BOX_W / 2, top + 3, box.element.type, 'uiStrong', 11, 'ink', 'center', BLOCK_BOX_W - 4),
    text(left + BLOCK_BOX_W / 2, box.y + 2, box.element.instance || '?', 'uiStrong', 12, 'label', 'center', BLOCK_BOX_W + 40),
  ];
  for (const pin of box.pins) {
    const inside = pin.side === 'in' ? left + 4 : right - 4;
    ops.push(text(inside, pin.y - 6, pin.name, 'mono', 10, 'muted', pin.side === 'in' ? 'left' : 'right', BLOCK_BOX_W / 2));
    if (pin.power) continue;
    if (pin.side === 'in') {
      ops.push(line([left - 8, pin.y, left, pin.y], 'ink', 1.5));
      ops.push(text(left - 11, pin.y - 6, pin.operand || '?', 'mono', 11, pin.operand ? 'label' : 'muted', 'right', BLOCK_BOX_LEFT - 12));
    } else {
      ops.push(line([right, pin.y, right + 8, pin.y], 'ink', 1.5));
    }
  }
  return ops;
}

function labelOps(box: ElementBox): DrawOp[] {
  if (box.element.kind === 'block') return [];
  const cx = box.x + box.width / 2;
  const width = box.width - 6;
  const ops: DrawOp[] = [];
  if (box.label.primary === '') ops.push(text(cx, box.y + 8, '?', 'uiStrong', 12, 'muted', 'center', width));
  else ops.push(text(cx, box.y + 6, box.label.primary, 'uiStrong', 12, 'label', 'center', width));
  if (box.label.secondary !== '') ops.push(text(cx, box.y + 21, box.label.secondary, 'mono', 10.5, 'muted', 'center', width));
  return ops;
}

function commentOps(box: ElementBox): DrawOp[] {
  const comment = box.element.comment?.trim();
  if (!comment) return [];
  return [text(box.x + box.width / 2, box.y + box.height - 18, comment, 'note', 10.5, 'muted', 'center', box.width - 6)];
}

/** The primitives of one element: symbol, labels, comment. */
export function elementOps(box: ElementBox): DrawOp[] {
  const cx = box.x + box.width / 2;
  const symbol =
    box.element.kind === 'contact'
      ? contactOps(cx, box.wireY, box.element.variant)
      : box.element.kind === 'coil'
        ? coilOps(cx, box.wireY, box.element.variant)
        : blockOps(box);
  return [...symbol, ...labelOps(box), ...commentOps(box)];
}

/** Everything to paint for one rung, in the rung's own coordinates. */
export function rungOps(rung: RungLayout, layout: Pick<ProgramLayout, 'rightRailX'>): DrawOp[] {
  const railX = LEFT_RAIL_X + RAIL_W / 2;
  const rightX = layout.rightRailX + RAIL_W / 2;
  const ops: DrawOp[] = [
    line([railX, rung.networkTop, railX, rung.networkBottom], 'ink', RAIL_W),
    line([rightX, rung.networkTop, rightX, rung.networkBottom], 'ink', RAIL_W),
    text(GUTTER_W - 12, rung.wireY - 8, String(rung.index + 1), 'mono', 13, 'muted', 'right', GUTTER_W - 12),
  ];
  if (rung.comment.trim() !== '') ops.push(text(NETWORK_TEXT_X, RUNG_PAD_TOP + 2, rung.comment, 'note', 12, 'muted', 'left', layout.rightRailX - NETWORK_TEXT_X));
  for (const wire of rung.wires) ops.push(line([wire.x1, wire.y1, wire.x2, wire.y2]));
  for (const box of rung.elements) ops.push(...elementOps(box));
  if (rung.text !== null) ops.push(text(NETWORK_TEXT_X, rung.networkBottom + 4, rung.text, 'mono', 11, 'muted', 'left', layout.rightRailX - NETWORK_TEXT_X));
  return ops;
}
