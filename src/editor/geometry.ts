/**
 * The fixed measures of the rung drawing, in canvas pixels at zoom 1. The layout function and the
 * Konva components read them from here, so what is drawn and what is hit-tested never disagree.
 */

/** Every element's wire (the horizontal conductor through it) runs this far below its top. */
export const WIRE_Y = 44;

/** A contact or coil cell: two label lines above the wire, the symbol on it, a comment below. */
export const CELL_W = 96;
export const CELL_H = 84;

/** Half the width of a contact's or coil's symbol, centred in its cell. */
export const SYMBOL_HALF_W = 14;
/** Half the height of a contact's bars and a coil's arcs. */
export const SYMBOL_HALF_H = 13;

/** A function block cell: input operands left of the box, the box, output names right of it. */
export const BLOCK_W = 184;
export const BLOCK_BOX_LEFT = 56;
export const BLOCK_BOX_W = 72;
/** Vertical distance between two pins of a block, power-flow pin on the wire. */
export const PIN_PITCH = 20;
/** The block box starts this far above the wire (room for the type name). */
export const BLOCK_HEAD = 20;
/** Space under the lowest pin, then one comment line. */
export const BLOCK_FOOT = 10;
export const COMMENT_LINE_H = 18;

/** The wire left empty in a series with nothing in it, so there is somewhere to drop. */
export const EMPTY_SERIES_W = 56;
/** The lead wire a parallel keeps on each side of its branches, for its vertical links. */
export const BRANCH_PAD = 14;

/** Rung frame: number gutter, rails, lead-in and lead-out wires. */
export const GUTTER_W = 52;
export const LEFT_RAIL_X = GUTTER_W + 8;
export const RAIL_W = 4;
export const LEAD_W = 18;
/**
 * The right rail never comes closer to the left one than this: room for six cells, so a common
 * rung (a start/stop with its seal-in, an interlocked direction) ends at the same rail, while the
 * whole drawing (about 730 px) still fits the canvas beside the palette and dock at 1280 px.
 */
export const MIN_RUNG_W = 640;
export const RUNG_PAD_TOP = 10;
export const RUNG_PAD_BOTTOM = 12;
export const RUNG_COMMENT_H = 22;
export const RUNG_TEXT_H = 22;

/** How close (px) the pointer must come to a drop slot to target it while dragging. */
export const SLOT_CATCH_RADIUS = 28;
/** The radius of a drop slot's marker. */
export const SLOT_MARK_R = 6;

/** Zoom limits of the canvas. */
export const MIN_ZOOM = 0.4;
export const MAX_ZOOM = 2.5;

/** Where rung comments and text forms start, in line with the left rail. */
export const NETWORK_TEXT_X = LEFT_RAIL_X;
