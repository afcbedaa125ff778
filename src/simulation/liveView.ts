/**
 * What the rung canvas colours while a simulation runs, per document id: whether a node was
 * energised, whether a contact passed power, a coil's variable, and a block's values (ET against
 * PT, CV against PV). Built from the runtime's power flow of the last scan; pure over a runtime.
 */
import type { Runtime } from '@shared/engine';
import type { Block, BlockType, Element, NetworkNode, Program } from '@shared/ladder/schema';
import { formatAddress } from '@shared/ladder/addresses';
import { resolveOperand } from '@shared/ladder/operands';
import { elementsOfProgram } from '@shared/ladder/walk';

/** A block's live figures, by what kind of block it is. */
export type BlockLive =
  | { kind: 'timer'; et: number; pt: number | null; q: boolean }
  | { kind: 'counter'; cv: number; pv: number | null; q: boolean }
  | { kind: 'bistable'; q: boolean };

/** The live state of one node. */
export interface ElementLive {
  /** Power arrives on its left. */
  left: boolean;
  /** Power leaves on its right (for a coil, the same as its left). Conductors after it are energised. */
  right: boolean;
  /** Contacts: it passes power now (NO with its variable TRUE, NC with it FALSE, an edge contact firing). */
  closed?: boolean;
  /** Contacts and coils: the variable's value after the scan; null when it names nothing. */
  value?: boolean | null;
  /** The variable is forced (violet badge). */
  forced?: boolean;
  block?: BlockLive;
}

export interface LiveView {
  /** The scan this view describes; 0 = nothing has run (everything de-energised). */
  readonly scanCount: number;
  get(id: string): ElementLive | undefined;
}

/** How each block type reports its figures. */
const BLOCK_FIGURES = {
  TON: 'timer',
  TOF: 'timer',
  TP: 'timer',
  CTU: 'counter',
  CTD: 'counter',
  CTUD: 'counter',
  R_TRIG: 'bistable',
  F_TRIG: 'bistable',
  SR: 'bistable',
  RS: 'bistable',
} as const satisfies Record<BlockType, BlockLive['kind']>;

const asNumber = (v: boolean | number | undefined): number | null => (typeof v === 'number' ? v : null);

function blockLive(runtime: Runtime, block: Block): BlockLive {
  const read = (member: string) => runtime.read(`${block.instance}.${member}`);
  const q = read(block.type === 'SR' || block.type === 'RS' ? 'Q1' : block.type === 'CTUD' ? 'QU' : 'Q') === true;
  const preset = (name: string): number | null => {
    const operand = block.inputs[name]?.trim() ?? '';
    return operand === '' ? null : asNumber(runtime.read(operand));
  };
  switch (BLOCK_FIGURES[block.type]) {
    case 'timer':
      return { kind: 'timer', et: asNumber(read('ET')) ?? 0, pt: preset('PT'), q };
    case 'counter':
      return { kind: 'counter', cv: asNumber(read('CV')) ?? 0, pv: preset('PV'), q };
    case 'bistable':
      return { kind: 'bistable', q };
  }
}

/**
 * The live view of a runtime after its last scan. Element lookups are computed on first `get` and
 * kept, so a canvas that draws only the visible rungs pays only for those.
 */
export function createLiveView(runtime: Runtime, program: Program | ElementIndex): LiveView {
  const flow = runtime.powerFlow();
  const forces = runtime.forces();
  const elements = 'rungs' in program ? elementIndex(program as Program) : (program as ElementIndex);
  const cache = new Map<string, ElementLive | undefined>();

  const forcedOperand = (operand: string): boolean => {
    if (forces.size === 0) return false;
    const key = canonicalBit(runtime, operand);
    return key !== null && forces.has(key);
  };

  const compute = (id: string): ElementLive | undefined => {
    const f = flow.get(id);
    if (f === undefined) return undefined;
    const element = elements.get(id);
    if (element === undefined) return { left: f.left, right: f.right };
    if (element.kind === 'block') return { left: f.left, right: f.right, block: blockLive(runtime, element) };
    const raw = runtime.read(element.operand);
    const value = typeof raw === 'boolean' ? raw : null;
    const forced = forcedOperand(element.operand);
    if (element.kind === 'coil') return { left: f.left, right: f.left, value, forced };
    // With power on its left, what it passed is exact; without, say what it would pass now.
    let closed: boolean;
    if (f.left) closed = f.right;
    else if (element.variant === 'no') closed = value === true;
    else if (element.variant === 'nc') closed = value === false;
    else closed = false;
    return { left: f.left, right: f.right, closed, value, forced };
  };

  return {
    scanCount: flow.scanCount,
    get(id) {
      if (!cache.has(id)) cache.set(id, compute(id));
      return cache.get(id);
    },
  };
}

/** Every element of a program by id; build it once per program and pass it to `createLiveView`. */
export type ElementIndex = ReadonlyMap<string, Element>;

export function elementIndex(program: Program): ElementIndex {
  const elements = new Map<string, Element>();
  for (const { element } of elementsOfProgram(program)) elements.set(element.id, element);
  return elements;
}

/** The canonical address (`%QX1`) an operand (address or tag) names, or null when it is not a bit. */
function canonicalBit(runtime: Runtime, operand: string): string | null {
  const resolved = resolveOperand(operand, runtime.plan.symbols);
  return resolved.ok && resolved.value.kind === 'bit' ? formatAddress(resolved.value.address) : null;
}

/** Every node id of a program, to walk a view in document order (tests, the text form). */
export function nodeIds(program: Program): string[] {
  const ids: string[] = [];
  const visit = (node: NetworkNode): void => {
    ids.push(node.id);
    if (node.kind === 'series') node.items.forEach(visit);
    else if (node.kind === 'parallel') node.branches.forEach(visit);
  };
  for (const rung of program.rungs) visit(rung.network);
  return ids;
}
