/**
 * Live power flow painted over the editor's rung drawing (the Konva canvas): after the static
 * draw list is painted, each conductor is painted again amber with a dash that flows left to right
 * when energised, or slate grey when not; contact bars, coil arcs and block boxes take the same
 * colours (amber only where power really passes); blocks get their ET/PT or CV/PV line and forced
 * variables the violet badge. Geometry comes from the editor's own layout and draw list, so the
 * live paint lies exactly over the drawing.
 */
import { elementOps } from '@/editor/drawList';
import { RAIL_W } from '@/editor/geometry';
import type { ElementBox, ProgramLayout, RungLayout } from '@/editor/layoutTypes';
import { FONT_MONO, FONT_UI, MIN_CANVAS_TEXT_PX, type Palette } from '@/theme';
import type { LiveView } from './liveView';
import { blockFigures, FLOW_DASH, flowDashOffset } from './useLiveView';
import { wireEnergised, wireNets, type WireNets } from './wireNets';

/** One stroke to paint: a polyline or an arc, energised or not. */
export type LiveMark =
  | { kind: 'line'; points: number[]; on: boolean; width: number; flow: boolean }
  | { kind: 'arc'; x: number; y: number; r: number; from: number; to: number; on: boolean; width: number }
  | { kind: 'rect'; x: number; y: number; w: number; h: number; on: boolean; width: number }
  | { kind: 'text'; x: number; y: number; text: string; badge: boolean };

/** The marks of one rung, from its layout and the live view (pure). */
export function liveRungMarks(rung: RungLayout, layout: Pick<ProgramLayout, 'leftRailX'>, view: LiveView): LiveMark[] {
  // About 30 wires a rung: grouping them again on each paint costs microseconds, and keeps no cache.
  const nets: WireNets = wireNets(rung.wires);
  const side = (id: string, s: 'in' | 'out'): boolean => {
    const l = view.get(id);
    return s === 'in' ? l?.left === true : l?.right === true;
  };
  const railX = layout.leftRailX + RAIL_W;
  const marks: LiveMark[] = [];
  const leftRailX = layout.leftRailX + RAIL_W / 2;
  marks.push({ kind: 'line', points: [leftRailX, rung.networkTop, leftRailX, rung.networkBottom], on: true, width: RAIL_W, flow: false });
  rung.wires.forEach((w, i) => {
    const on = wireEnergised(rung.wires, nets, i, side, (wire) => Math.min(wire.x1, wire.x2) <= railX + 0.5);
    marks.push({ kind: 'line', points: [w.x1, w.y1, w.x2, w.y2], on, width: 2.5, flow: on });
  });
  for (const box of rung.elements) marks.push(...elementMarks(box, view));
  return marks;
}

function elementMarks(box: ElementBox, view: LiveView): LiveMark[] {
  const live = view.get(box.id);
  if (!live) return [];
  const on = box.element.kind === 'contact' ? live.left && live.closed === true : box.element.kind === 'coil' ? live.left : live.right;
  const marks: LiveMark[] = [];
  for (const op of elementOps(box)) {
    if (op.op === 'line' && (box.element.kind !== 'block' || op.width < 2)) {
      marks.push({ kind: 'line', points: op.points, on, width: op.width + 0.5, flow: false });
    } else if (op.op === 'arc') marks.push({ kind: 'arc', x: op.x, y: op.y, r: op.r, from: op.from, to: op.to, on, width: op.width + 0.5 });
    else if (op.op === 'rect') marks.push({ kind: 'rect', x: op.x, y: op.y, w: op.w, h: op.h, on, width: op.width });
  }
  if (box.element.kind === 'contact' && live.closed) {
    // The contact is made: a bridge between its bars (amber only if power passes through it).
    const cx = box.x + box.width / 2;
    marks.push({ kind: 'line', points: [cx - 10, box.wireY, cx + 10, box.wireY], on, width: 3, flow: false });
  }
  if (box.element.kind === 'block') marks.push({ kind: 'text', x: box.x + box.width / 2, y: box.y + box.height - 14, text: blockFigures(live), badge: false });
  if (live.forced) marks.push({ kind: 'text', x: box.x + box.width - 24, y: box.wireY + 14, text: 'forced', badge: true });
  return marks;
}

/** Paint marks on a 2D canvas context (Konva's `ctx._context` or a plain canvas). */
export function paintLiveMarks(ctx: CanvasRenderingContext2D, marks: readonly LiveMark[], palette: Palette, nowMs: number): void {
  ctx.save();
  ctx.lineCap = 'butt';
  for (const m of marks) {
    if (m.kind === 'text') {
      if (m.badge) {
        ctx.fillStyle = palette.forced;
        ctx.beginPath();
        ctx.roundRect?.(m.x - 24, m.y - 8, 48, 16, 8);
        ctx.fill();
        ctx.fillStyle = '#fff';
        ctx.font = `700 ${MIN_CANVAS_TEXT_PX}px ${FONT_UI}`;
      } else {
        ctx.fillStyle = palette.energised;
        ctx.font = `700 ${MIN_CANVAS_TEXT_PX}px ${FONT_MONO}`;
      }
      ctx.textAlign = 'center';
      ctx.textBaseline = 'middle';
      ctx.fillText(m.text, m.x, m.y);
      continue;
    }
    ctx.strokeStyle = m.on ? palette.energised : palette.deEnergised;
    ctx.lineWidth = m.width;
    ctx.beginPath();
    if (m.kind === 'line') {
      ctx.setLineDash(m.flow ? FLOW_DASH : []);
      ctx.lineDashOffset = m.flow ? flowDashOffset(nowMs) : 0;
      ctx.moveTo(m.points[0]!, m.points[1]!);
      for (let i = 2; i + 1 < m.points.length; i += 2) ctx.lineTo(m.points[i]!, m.points[i + 1]!);
      if (m.flow) {
        // Under the dashes the conductor stays visible in a pale amber: paper first, so the ink
        // line drawn beneath does not show through the gaps, then amber at 40 %.
        ctx.save();
        ctx.setLineDash([]);
        ctx.strokeStyle = palette.paper;
        ctx.stroke();
        ctx.globalAlpha = 0.4;
        ctx.strokeStyle = palette.energised;
        ctx.stroke();
        ctx.restore();
      }
    } else if (m.kind === 'arc') {
      ctx.setLineDash([]);
      ctx.arc(m.x, m.y, m.r, m.from, m.to, false);
    } else {
      ctx.setLineDash([]);
      ctx.rect(m.x, m.y, m.w, m.h);
    }
    ctx.stroke();
  }
  ctx.restore();
}
