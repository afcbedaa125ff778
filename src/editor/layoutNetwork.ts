/**
 * Places one rung's series-parallel network: measures every node, then walks it once emitting
 * element boxes, wire segments and drop slots. Pure; sizes come from `geometry.ts`.
 *
 * Rules (common practice for ladder diagrams): the items of a series sit side by side on one wire;
 * the branches of a parallel stack downwards, the first on the wire of its series, joined by
 * vertical links at both ends; a shorter branch is extended by wire to the right link. The coils
 * that end the root series are pushed against the right rail.
 */
import { BLOCK_SPECS, operandInputs } from '@shared/ladder/blocks';
import type { Element, NetworkNode, Series } from '@shared/ladder/schema';
import {
  BLOCK_BOX_LEFT,
  BLOCK_BOX_W,
  BLOCK_FOOT,
  BLOCK_W,
  BRANCH_PAD,
  CELL_H,
  CELL_W,
  COMMENT_LINE_H,
  EMPTY_SERIES_W,
  PIN_PITCH,
  SYMBOL_HALF_W,
  WIRE_Y,
} from './geometry';
import type { DropSlot, ElementBox, LayoutOptions, OperandLabel, PinLayout, SlotTarget, WireSegment } from './layoutTypes';

/** Width and height of a node, in px. */
export interface Size {
  width: number;
  height: number;
}

/** Everything emitted while placing one rung. */
export interface NetworkDrawing {
  elements: ElementBox[];
  wires: WireSegment[];
  slots: DropSlot[];
}

/** The number of pins down the tallest side of a block. */
function blockRows(element: Element & { kind: 'block' }): number {
  const spec = BLOCK_SPECS[element.type];
  return Math.max(spec.inputs.length, spec.outputs.length);
}

/** The size of one element's cell. */
export function elementSize(element: Element): Size {
  if (element.kind !== 'block') return { width: CELL_W, height: CELL_H };
  const pinsBottom = WIRE_Y + (blockRows(element) - 1) * PIN_PITCH + BLOCK_FOOT;
  return { width: BLOCK_W, height: pinsBottom + COMMENT_LINE_H + 6 };
}

/** The size of any node; an empty series keeps a short wire so something can be dropped on it. */
export function measureNode(node: NetworkNode): Size {
  if (node.kind === 'series') {
    if (node.items.length === 0) return { width: EMPTY_SERIES_W, height: CELL_H };
    let width = 0;
    let height = 0;
    for (const item of node.items) {
      const size = measureNode(item);
      width += size.width;
      height = Math.max(height, size.height);
    }
    return { width, height };
  }
  if (node.kind === 'parallel') {
    if (node.branches.length === 0) return { width: EMPTY_SERIES_W, height: CELL_H };
    let width = 0;
    let height = 0;
    for (const branch of node.branches) {
      const size = measureNode(branch);
      width = Math.max(width, size.width);
      height += size.height;
    }
    return { width: width + 2 * BRANCH_PAD, height };
  }
  return elementSize(node);
}

/** True when a node holds only coils: such nodes end a rung and are drawn against the right rail. */
function isOutputOnly(node: NetworkNode): boolean {
  if (node.kind === 'coil') return true;
  if (node.kind === 'contact' || node.kind === 'block') return false;
  const children = node.kind === 'series' ? node.items : node.branches;
  return children.length > 0 && children.every(isOutputOnly);
}

/** The index in the root series where the trailing run of coils starts (items.length if none). */
export function outputTailStart(root: Series): number {
  let start = root.items.length;
  while (start > 0 && isOutputOnly(root.items[start - 1] as NetworkNode)) start -= 1;
  return start;
}

/** Tag name and address for the label above a contact or coil. */
export function operandLabel(operand: string, tagAddresses: ReadonlyMap<string, string>): OperandLabel {
  const text = operand.trim();
  if (text === '') return { primary: '', secondary: '' };
  const upper = text.toUpperCase();
  const isAddress = text.startsWith('%');
  for (const [name, tagAddress] of tagAddresses) {
    if (!isAddress && name.toUpperCase() === upper) return { primary: name, secondary: tagAddress };
    if (isAddress && tagAddress.toUpperCase() === upper) return { primary: name, secondary: text };
  }
  return { primary: text, secondary: '' };
}

function blockPins(element: Element & { kind: 'block' }, wireY: number): PinLayout[] {
  const spec = BLOCK_SPECS[element.type];
  const operandNames = new Set(operandInputs(element.type).map((p) => p.name));
  const inputs = spec.inputs.map((param, row) => ({
    name: param.name,
    side: 'in' as const,
    y: wireY + row * PIN_PITCH,
    operand: operandNames.has(param.name) ? (element.inputs[param.name] ?? '') : '',
    power: param.name === spec.powerIn,
  }));
  const outputs = spec.outputs.map((param, row) => ({
    name: param.name,
    side: 'out' as const,
    y: wireY + row * PIN_PITCH,
    operand: '',
    power: param.name === spec.powerOut,
  }));
  return [...inputs, ...outputs];
}

/** Walks one rung's network, collecting what to draw. */
class NetworkPlacer {
  readonly drawing: NetworkDrawing = { elements: [], wires: [], slots: [] };

  constructor(
    private readonly rungId: string,
    private readonly options: LayoutOptions,
  ) {}

  private slot(target: Omit<SlotTarget, 'rungId'>, x: number, y: number): void {
    const full: SlotTarget = { rungId: this.rungId, ...target };
    const key = `${this.rungId}/${target.path.join('.')}/${target.index}`;
    this.drawing.slots.push({ key, target: full, x, y });
  }

  private wire(x1: number, y1: number, x2: number, y2: number, flow?: WireSegment['flow']): void {
    if (x1 === x2 && y1 === y2) return;
    this.drawing.wires.push(flow ? { x1, y1, x2, y2, flow } : { x1, y1, x2, y2 });
  }

  /** Place the root series, stretched to `width` with its coils against the right end. */
  placeRoot(root: Series, x: number, y: number, width: number): void {
    const natural = measureNode(root).width;
    const stretch = Math.max(0, width - natural);
    const tail = outputTailStart(root);
    this.placeSeries(root, [], x, y, stretch, tail);
  }

  private placeSeries(series: Series, path: number[], x: number, y: number, stretch = 0, stretchAt = -1): void {
    const wireY = y + WIRE_Y;
    if (series.items.length === 0) {
      const width = EMPTY_SERIES_W + stretch;
      this.wire(x, wireY, x + width, wireY);
      this.slot({ path, index: 0 }, x + Math.min(width, EMPTY_SERIES_W) / 2, wireY);
      return;
    }
    let cursor = x;
    series.items.forEach((item, index) => {
      if (index === stretchAt && stretch > 0) {
        this.slot({ path, index }, cursor, wireY);
        this.wire(cursor, wireY, cursor + stretch, wireY);
        cursor += stretch;
      } else {
        this.slot({ path, index }, cursor, wireY);
      }
      cursor += this.placeNode(item, [...path, index], cursor, y);
    });
    this.slot({ path, index: series.items.length }, cursor, wireY);
    if (stretchAt === series.items.length && stretch > 0) this.wire(cursor, wireY, cursor + stretch, wireY);
  }

  /** Place any node with its top-left at (x, y); returns its width. */
  private placeNode(node: NetworkNode, path: number[], x: number, y: number): number {
    if (node.kind === 'series') {
      this.placeSeries(node, path, x, y);
      return measureNode(node).width;
    }
    if (node.kind === 'parallel') return this.placeParallel(node, path, x, y);
    return this.placeElement(node, path, x, y);
  }

  private placeParallel(node: NetworkNode & { kind: 'parallel' }, path: number[], x: number, y: number): number {
    const { width } = measureNode(node);
    const right = x + width;
    let top = y;
    let lastWire = y + WIRE_Y;
    node.branches.forEach((branch, index) => {
      const branchPath = [...path, index];
      const size = measureNode(branch);
      const wireY = top + WIRE_Y;
      this.wire(x, wireY, x + BRANCH_PAD, wireY);
      const start = x + BRANCH_PAD;
      const end = start + size.width;
      if (branch.kind === 'series') {
        this.placeSeries(branch, branchPath, start, top);
      } else if (branch.kind === 'parallel') {
        this.placeParallel(branch, branchPath, start, top);
      } else {
        // A lone element as a branch: a slot either side of it (inserting makes it a series).
        this.slot({ path: branchPath, index: 0 }, start, wireY);
        this.placeElement(branch, branchPath, start, top);
        this.slot({ path: branchPath, index: 1 }, end, wireY);
      }
      this.wire(end, wireY, right, wireY);
      lastWire = wireY;
      top += size.height;
    });
    this.wire(x, y + WIRE_Y, x, lastWire);
    this.wire(right, y + WIRE_Y, right, lastWire);
    return width;
  }

  private placeElement(element: Element, path: number[], x: number, y: number): number {
    const size = elementSize(element);
    const wireY = y + WIRE_Y;
    const label =
      element.kind === 'block'
        ? { primary: element.instance, secondary: '' }
        : operandLabel(element.operand, this.options.tagAddresses);
    const pins = element.kind === 'block' ? blockPins(element, wireY) : [];
    this.drawing.elements.push({
      id: element.id,
      rungId: this.rungId,
      path,
      element,
      x,
      y,
      width: size.width,
      height: size.height,
      wireY,
      label,
      pins,
    });
    if (element.kind === 'block') {
      const boxLeft = x + BLOCK_BOX_LEFT;
      this.wire(x, wireY, boxLeft, wireY, { nodeId: element.id, side: 'in' });
      this.wire(boxLeft + BLOCK_BOX_W, wireY, x + size.width, wireY, { nodeId: element.id, side: 'out' });
    } else {
      const centre = x + size.width / 2;
      this.wire(x, wireY, centre - SYMBOL_HALF_W, wireY, { nodeId: element.id, side: 'in' });
      this.wire(centre + SYMBOL_HALF_W, wireY, x + size.width, wireY, { nodeId: element.id, side: 'out' });
    }
    return size.width;
  }
}

/** Place a rung's network with its top-left at (x, y), stretched to `width`. */
export function placeNetwork(
  rungId: string,
  root: Series,
  x: number,
  y: number,
  width: number,
  options: LayoutOptions,
): NetworkDrawing {
  const placer = new NetworkPlacer(rungId, options);
  placer.placeRoot(root, x, y, width);
  return placer.drawing;
}
