/**
 * The live state of one drawn rung as plain data — each conductor's colour and each element's
 * look — so a view can compare it with the previous refresh and redraw only the rungs that changed.
 */
import { RAIL_W } from '@/editor/geometry';
import type { RungLayout } from '@/editor/layoutTypes';
import type { LiveView } from './liveView';
import { blockFigures } from './useLiveView';
import { wireEnergised, type WireNets } from './wireNets';

/** `ink`: no simulation; `on`: energised; `off`: de-energised. */
export type Ink = 'ink' | 'on' | 'off';

export interface ElementLook {
  ink: Ink;
  /** A contact that is made (closed), whether or not power reaches it. */
  made: boolean;
  /** `closed`/`open`, `energised`/`de-energised`, or a block's figures; '' without a simulation. */
  word: string;
  forced: boolean;
}

export interface RungLook {
  /** The rung's right end is energised (null without a simulation). */
  energised: boolean | null;
  wires: Ink[];
  elements: Record<string, ElementLook>;
}

const PLAIN: ElementLook = Object.freeze({ ink: 'ink', made: false, word: '', forced: false });

/** The look of a rung from the live view (or the plain ink drawing when `view` is null). */
export function rungLook(rung: RungLayout, nets: WireNets, view: LiveView | null, leftRailX: number): RungLook {
  if (view === null) {
    return { energised: null, wires: rung.wires.map(() => 'ink'), elements: Object.fromEntries(rung.elements.map((b) => [b.id, PLAIN])) };
  }
  const side = (id: string, s: 'in' | 'out'): boolean => {
    const l = view.get(id);
    return s === 'in' ? l?.left === true : l?.right === true;
  };
  const railX = leftRailX + RAIL_W + 0.5;
  const wires = rung.wires.map((_, i): Ink => (wireEnergised(rung.wires, nets, i, side, (w) => Math.min(w.x1, w.x2) <= railX) ? 'on' : 'off'));
  const elements: Record<string, ElementLook> = {};
  for (const box of rung.elements) {
    const l = view.get(box.id);
    if (!l) {
      elements[box.id] = PLAIN;
      continue;
    }
    const kind = box.element.kind;
    // Amber only where power really passes; a closed contact with no power on its left stays grey.
    const on = kind === 'contact' ? l.left && l.closed === true : kind === 'coil' ? l.left : l.right;
    const word = kind === 'contact' ? (l.closed ? 'closed' : 'open') : kind === 'coil' ? (l.left ? 'energised' : 'de-energised') : blockFigures(l);
    elements[box.id] = { ink: on ? 'on' : 'off', made: kind === 'contact' && l.closed === true, word, forced: l.forced === true };
  }
  return { energised: side(rung.rungId, 'out'), wires, elements };
}
