/**
 * Rungs → the elements of a PLCopen `LD` body. Each rung gets its own left and right rail, its
 * elements in network order, and its comment above it. Power flow is written the TC6 way: the
 * receiving element lists in `connectionPointIn` a `connection refLocalId` for every element that
 * feeds it, so the items after a parallel branch list every branch's last element (an OR join).
 */
import { BLOCK_SPECS } from '../blocks';
import type { Block, Coil, Contact, Element, NetworkNode, Rung } from '../schema';
import { GRID } from './constants';
import { formattedText, rungwrightAddData } from './formatted';
import { layoutNetwork, type RungGrid } from './layout';
import { el, text, type XmlElement } from './xmlTree';

/** An output that feeds what comes next, and the height its wire leaves at. */
interface Source {
  refLocalId: number;
  /** Set for a block output (the TC6 way to name which output). */
  formalParameter?: string;
  /** Absolute y of the output pin, for the receiving pin's wire. */
  y: number;
}

/** Hands out localIds, unique within the body, in writing order. */
interface IdCounter {
  next(): number;
}

/** Where a rung sits on the page. */
interface RungFrame {
  rung: Rung;
  /** `localId=elementId` of each element written, for the rung's `addData`. */
  written: string[];
  grid: RungGrid;
  /** Top of the rung's grid (below its comment). */
  top: number;
  /** x of the right rail, the same for every rung so the page reads as one diagram. */
  rightRailX: number;
}

const columnX = (col: number): number => GRID.railWidth + GRID.margin + col * GRID.cellWidth;
const rowCentre = (frame: RungFrame, row: number): number => frame.top + row * GRID.cellHeight + GRID.cellHeight / 2;

/** Every body element of the program's rungs, top to bottom. */
export function exportLdBody(rungs: readonly Rung[]): XmlElement[] {
  let localId = 0;
  const ids: IdCounter = { next: () => (localId += 1) };
  const grids = rungs.map((rung) => layoutNetwork(rung.network));
  const widest = Math.max(1, ...grids.map((grid) => grid.cols));
  const rightRailX = columnX(widest) + GRID.margin;

  const body: XmlElement[] = [];
  let y = 0;
  rungs.forEach((rung, index) => {
    const grid = grids[index] as RungGrid;
    if (rung.comment !== '') {
      body.push(commentElement(ids.next(), rung, y, rightRailX));
      y += GRID.commentBand;
    }
    const frame: RungFrame = { rung, written: [], grid, top: y, rightRailX };
    body.push(...rungElements(frame, ids));
    y += grid.rows * GRID.cellHeight + GRID.rungGap;
  });
  return body;
}

function commentElement(localId: number, rung: Rung, top: number, width: number): XmlElement {
  return el('comment', { localId, height: GRID.commentHeight, width: width - GRID.railWidth }, [
    position(GRID.railWidth, top),
    formattedText('content', rung.comment),
    rungwrightAddData('rung', { rung: rung.id }),
  ]);
}

/**
 * One rung between its own pair of rails. The left rail's `addData` names the rung and maps each
 * element's localId to its Rungwright id: one record per rung keeps the file small.
 */
function rungElements(frame: RungFrame, ids: IdCounter): XmlElement[] {
  const height = frame.grid.rows * GRID.cellHeight;
  const leftId = ids.next();
  const out: XmlElement[] = [];
  const start: Source = { refLocalId: leftId, y: rowCentre(frame, 0) };
  const ends = emitNode(frame.rung.network, [start], frame, ids, out);
  const rightPins = ends.map((source) =>
    el('connectionPointIn', {}, [relPosition(0, source.y - frame.top), connection(source)]),
  );
  const leftRail = el('leftPowerRail', { localId: leftId, height, width: GRID.railWidth }, [
    position(0, frame.top),
    el('connectionPointOut', { formalParameter: '' }, [relPosition(GRID.railWidth, GRID.cellHeight / 2)]),
    rungwrightAddData('rung', { rung: frame.rung.id, elements: frame.written.join(' ') }),
  ]);
  const rightRail = el('rightPowerRail', { localId: ids.next(), height, width: GRID.railWidth }, [
    position(frame.rightRailX, frame.top),
    ...rightPins,
  ]);
  return [leftRail, ...out, rightRail];
}

/** Write a node fed by `inputs`; return what feeds the node after it. */
function emitNode(node: NetworkNode, inputs: Source[], frame: RungFrame, ids: IdCounter, out: XmlElement[]): Source[] {
  if (node.kind === 'series') {
    return node.items.reduce((feeding, item) => emitNode(item, feeding, frame, ids, out), inputs);
  }
  if (node.kind === 'parallel') {
    if (node.branches.length === 0) return inputs;
    const ends = node.branches.flatMap((branch) => emitNode(branch, inputs, frame, ids, out));
    return uniqueSources(ends);
  }
  return [emitElement(node, inputs, frame, ids, out)];
}

/** Two empty branches side by side would list the same feed twice. */
function uniqueSources(sources: Source[]): Source[] {
  const seen = new Set<string>();
  return sources.filter((source) => {
    const key = `${source.refLocalId}/${source.formalParameter ?? ''}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

function emitElement(element: Element, inputs: Source[], frame: RungFrame, ids: IdCounter, out: XmlElement[]): Source {
  const cell = frame.grid.cells.get(element.id);
  const col = cell?.col ?? 0;
  const row = cell?.row ?? 0;
  const pinY = rowCentre(frame, row);
  if (element.kind === 'block') return emitBlock(element, inputs, frame, col, row, ids, out);

  const localId = ids.next();
  const x = columnX(col) + (GRID.cellWidth - GRID.elementWidth) / 2;
  const y = pinY - GRID.elementHeight / 2;
  const half = GRID.elementHeight / 2;
  out.push(
    el(element.kind, { localId, height: GRID.elementHeight, width: GRID.elementWidth, ...variantAttributes(element) }, [
      position(x, y),
      el('connectionPointIn', {}, [relPosition(0, half), ...inputs.map(connection)]),
      el('connectionPointOut', {}, [relPosition(GRID.elementWidth, half)]),
      el('variable', {}, [text(element.operand)]),
      ...documentation(element.comment),
    ]),
  );
  frame.written.push(`${localId}=${element.id}`);
  return { refLocalId: localId, y: pinY };
}

/** IEC 61131-3 modifiers as TC6 attributes: `negated`, `edge` (contacts and transition-sensing coils), `storage` (coils). */
function variantAttributes(element: Contact | Coil): Record<string, string> {
  if (element.kind === 'contact') {
    return {
      negated: String(element.variant === 'nc'),
      edge: element.variant === 'rising' || element.variant === 'falling' ? element.variant : 'none',
    };
  }
  return {
    negated: String(element.variant === 'negated'),
    edge: element.variant === 'positive' ? 'rising' : element.variant === 'negative' ? 'falling' : 'none',
    storage: element.variant === 'set' || element.variant === 'reset' ? element.variant : 'none',
  };
}

/**
 * A block with its formal parameters. The power-flow input takes the rung; every other input
 * given as an operand is fed by an `inVariable` whose `expression` is the operand, in the column
 * to the block's left, on the row of its pin.
 */
function emitBlock(block: Block, inputs: Source[], frame: RungFrame, col: number, row: number, ids: IdCounter, out: XmlElement[]): Source {
  const spec = BLOCK_SPECS[block.type];
  const top = frame.top + row * GRID.cellHeight;
  const pinOffset = (index: number): number => index * GRID.cellHeight + GRID.cellHeight / 2;
  const blockX = columnX(col + 1) + (GRID.cellWidth - GRID.blockWidth) / 2;
  const blockY = top + GRID.cellHeight / 2 - GRID.elementHeight;
  const blockHeight = (Math.max(spec.inputs.length, spec.outputs.length) - 1) * GRID.cellHeight + 2 * GRID.elementHeight;

  const inputPins = spec.inputs.map((param, index) => {
    const relY = pinOffset(index) - (blockY - top);
    if (param.name === spec.powerIn) {
      return blockPin('connectionPointIn', param.name, 0, relY, inputs.map(connection));
    }
    const operand = block.inputs[param.name];
    if (operand === undefined) return blockPin('connectionPointIn', param.name, 0, relY, []);
    const sourceId = emitInVariable(operand, columnX(col), top + pinOffset(index), ids, out);
    return blockPin('connectionPointIn', param.name, 0, relY, [connection({ refLocalId: sourceId, y: 0 })]);
  });
  const outputPins = spec.outputs.map((param, index) =>
    blockPin('connectionPointOut', param.name, GRID.blockWidth, pinOffset(index) - (blockY - top), []),
  );

  const localId = ids.next();
  out.push(
    el('block', { localId, width: GRID.blockWidth, height: blockHeight, typeName: block.type, instanceName: block.instance }, [
      position(blockX, blockY),
      el('inputVariables', {}, inputPins),
      el('inOutVariables'),
      el('outputVariables', {}, outputPins),
      ...documentation(block.comment),
    ]),
  );
  frame.written.push(`${localId}=${block.id}`);
  return { refLocalId: localId, formalParameter: spec.powerOut, y: top + pinOffset(0) };
}

function emitInVariable(operand: string, cellX: number, pinY: number, ids: IdCounter, out: XmlElement[]): number {
  const localId = ids.next();
  const x = cellX + (GRID.cellWidth - GRID.inVariableWidth) / 2;
  const half = GRID.inVariableHeight / 2;
  out.push(
    el('inVariable', { localId, height: GRID.inVariableHeight, width: GRID.inVariableWidth }, [
      position(x, pinY - half),
      el('connectionPointOut', {}, [relPosition(GRID.inVariableWidth, half)]),
      el('expression', {}, [text(operand)]),
    ]),
  );
  return localId;
}

function blockPin(point: 'connectionPointIn' | 'connectionPointOut', formalParameter: string, x: number, y: number, connections: XmlElement[]): XmlElement {
  return el('variable', { formalParameter }, [el(point, {}, [relPosition(x, y), ...connections])]);
}

function documentation(comment: string | undefined): XmlElement[] {
  return comment === undefined ? [] : [formattedText('documentation', comment)];
}

function connection(source: Source): XmlElement {
  return el('connection', { refLocalId: source.refLocalId, formalParameter: source.formalParameter });
}

function position(x: number, y: number): XmlElement {
  return el('position', { x, y });
}

function relPosition(x: number, y: number): XmlElement {
  return el('relPosition', { x, y });
}
