/**
 * What the layout function produces: boxes, wires and drop slots in canvas pixels. Everything is
 * computed from the document each time; nothing here is ever stored in the program.
 */
import type { Element } from '@shared/ladder/schema';

/** A straight conductor. `flow` names the element whose input or output side it belongs to. */
export interface WireSegment {
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  flow?: { nodeId: string; side: 'in' | 'out' };
}

/** One pin of a function block, with what is wired to it. */
export interface PinLayout {
  name: string;
  side: 'in' | 'out';
  /** Absolute y of the pin in rung coordinates. */
  y: number;
  /** The operand written beside an input pin; empty for the power-flow pin and for outputs. */
  operand: string;
  /** True for the pin the rung's power flows through. */
  power: boolean;
}

/** The two short lines written above a contact or coil: the tag name and the address it stands for. */
export interface OperandLabel {
  primary: string;
  secondary: string;
}

/** Where an element is drawn, in rung coordinates (origin at the rung's top-left). */
export interface ElementBox {
  id: string;
  rungId: string;
  /** Path from the rung's root series to this element. */
  path: number[];
  element: Element;
  x: number;
  y: number;
  width: number;
  height: number;
  /** Absolute y of the wire through the element. */
  wireY: number;
  label: OperandLabel;
  /** Block pins; empty for contacts and coils. */
  pins: PinLayout[];
}

/**
 * Where a new element can go. `path` names a series (insert at `index` among its items) or, inside
 * a parallel, a single element standing as a branch (index 0 = before it, 1 = after it; inserting
 * turns that branch into a series).
 */
export interface SlotTarget {
  rungId: string;
  path: number[];
  index: number;
}

/** A drop slot: a point on a wire that lights up while something is dragged over it. */
export interface DropSlot {
  /** Stable within one layout: `rungId/path/index`. */
  key: string;
  target: SlotTarget;
  x: number;
  y: number;
}

/** One rung, in its own coordinates; `top` places it in the program. */
export interface RungLayout {
  rungId: string;
  /** 0-based position in the program; the drawn rung number is index + 1. */
  index: number;
  top: number;
  height: number;
  /** Where the network (rails) starts and ends vertically, rung coordinates. */
  networkTop: number;
  networkBottom: number;
  /** The y of the rung's main wire, for the rung number. */
  wireY: number;
  comment: string;
  /** The one-line text form when shown, else `null`. */
  text: string | null;
  /** The rung's drawing: placed when first read (`layout.ts`), the same arrays on every read. */
  readonly elements: ElementBox[];
  readonly wires: WireSegment[];
  readonly slots: DropSlot[];
}

/** The whole program's drawing. */
export interface ProgramLayout {
  width: number;
  height: number;
  leftRailX: number;
  rightRailX: number;
  rungs: RungLayout[];
}

/** What the layout needs beyond the network. */
export interface LayoutOptions {
  /** Tag name → address, to write both above an operand. */
  tagAddresses: ReadonlyMap<string, string>;
  /** Rung id → one-line text form, when the text form is shown. */
  rungText?: ReadonlyMap<string, string>;
}
