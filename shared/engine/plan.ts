/**
 * The executable plan: a validated program lowered onto typed memory. Every operand is resolved to
 * a numeric index (a bit of the image, a block instance, an edge memory) or a constant, so running
 * a plan never looks at text a user typed. The kernel (`kernel.ts`) is emitted from this alone.
 */
import type { AddressSpace } from '../ladder/addresses';
import type { ParamType } from '../ladder/blocks';
import type { SymbolTable } from '../ladder/operands';
import type { BlockType, CoilVariant, ContactVariant, Program, Rung } from '../ladder/schema';
import { COIL_VARIANTS, CONTACT_VARIANTS } from './elements';

/** Where each area starts in the one bit image: inputs, then outputs, then memory. */
export interface BitLayout {
  readonly inputs: number;
  readonly outputs: number;
  readonly memory: number;
  /** Total number of bits. */
  readonly size: number;
}

/** Where a value comes from when a plan runs. */
export type PlanSource =
  /** A bit of the image (0 or 1). */
  | { readonly kind: 'bit'; readonly bit: number }
  /** An output of a block instance, read from its state after its latest call. */
  | { readonly kind: 'member'; readonly instance: number; readonly member: string; readonly type: ParamType }
  /** A constant: BOOL as 0/1, TIME in ms, INT. */
  | { readonly kind: 'constant'; readonly value: number };

interface NodeBase {
  /** The document id of the node (element, series or parallel). */
  readonly id: string;
  /** Index of this node in the power-flow arrays. */
  readonly flow: number;
}

export interface PlanSeries extends NodeBase {
  readonly op: 'series';
  readonly items: readonly PlanNode[];
}

export interface PlanParallel extends NodeBase {
  readonly op: 'parallel';
  readonly branches: readonly PlanNode[];
}

export interface PlanContact extends NodeBase {
  readonly op: 'contact';
  readonly variant: ContactVariant;
  readonly source: PlanSource;
  /** Index of this contact's own edge memory; -1 for NO/NC contacts. */
  readonly edge: number;
}

export interface PlanCoil extends NodeBase {
  readonly op: 'coil';
  readonly variant: CoilVariant;
  /** The bit written (an output or memory bit; never an input). */
  readonly bit: number;
  /** Index of this coil's own edge memory; -1 for variants without one (all today's). */
  readonly edge: number;
}

/** A block input given as an operand, or left open (then FALSE / 0). */
export interface PlanBlockInput {
  /** Formal parameter name from `BLOCK_SPECS`. */
  readonly name: string;
  readonly type: ParamType;
  readonly source: PlanSource;
}

export interface PlanBlock extends NodeBase {
  readonly op: 'block';
  readonly type: BlockType;
  readonly instance: number;
  /** The power-flow input's formal name (IN, CU, CLK, S1, S). */
  readonly powerIn: string;
  /** The power-flow output's formal name (Q, QU, Q1). */
  readonly powerOut: string;
  /** Every input except the power-flow one, in the standard's order. */
  readonly inputs: readonly PlanBlockInput[];
  /**
   * True for the first call of the instance in a scan; later calls of the same instance are charged
   * no time, so a timer called twice per scan does not run twice as fast.
   */
  readonly chargesTime: boolean;
}

export type PlanNode = PlanSeries | PlanParallel | PlanContact | PlanCoil | PlanBlock;
export type PlanOp = PlanNode['op'];

export interface PlanRung {
  readonly id: string;
  readonly network: PlanSeries;
}

/** A node's kind in `PlanNodes`, by number. */
export const NODE_OP = { series: 0, parallel: 1, contact: 2, coil: 3, block: 4 } as const satisfies Record<PlanOp, number>;

/** Numbers per node in `PlanNodes.data`. */
export const NODE_STRIDE = 4;

/**
 * Every rung network as one table of numbers, the nodes in document order (depth first, a node
 * before its children), node `i` at `data[NODE_STRIDE * i]`; `i` is its power-flow index. Per node:
 *
 *   +0  its kind (`NODE_OP`)
 *   +1  series and parallel: how many children follow (each with its own children);
 *       contact and coil: the variant's index in `CONTACT_VARIANTS` / `COIL_VARIANTS`;
 *       block: its index in `Plan.blocks`
 *   +2  contact: the index of what it examines in `Plan.sources`; coil: the bit it writes
 *   +3  contact and coil: its edge memory, -1 without
 *
 * Why: lowering a long program made an object per node, and allocating them (and the garbage
 * collector copying them while they were young) was the costliest part of compiling; a table of
 * numbers is one allocation. `Plan.rungs` gives the same program as objects, built on first use.
 */
export interface PlanNodes {
  readonly data: Int32Array;
  /** Node index of each rung's root series, in rung order. */
  readonly roots: Int32Array;
  /** Elements (contacts, coils, blocks) in each rung, in rung order. */
  readonly elements: Int32Array;
}

/** A block instance: one piece of memory, possibly called from several rungs. */
export interface PlanInstance {
  /** The name as first written, e.g. `T1`. */
  readonly name: string;
  /** The symbol key (upper case), how operands name it. */
  readonly key: string;
  readonly type: BlockType;
}

/** An edge memory: which element owns it and what it examines or writes. */
export interface PlanEdge {
  readonly elementId: string;
  /** Canonical text of the element's operand, e.g. `%IX2` or `T1.Q`. */
  readonly operand: string;
}

export interface Plan {
  readonly program: Program;
  readonly space: AddressSpace;
  readonly layout: BitLayout;
  readonly symbols: SymbolTable;
  /** The rungs as objects (built from `nodes` on first use: the kernel reads `nodes`). */
  readonly rungs: readonly PlanRung[];
  /** The rungs as one table of numbers (see `PlanNodes`). */
  readonly nodes: PlanNodes;
  /** What the contacts examine, each distinct source once (`PlanNodes`, +2). */
  readonly sources: readonly PlanSource[];
  /** The block calls, in document order (`PlanNodes`, +1). */
  readonly blocks: readonly PlanBlock[];
  readonly instances: readonly PlanInstance[];
  readonly edges: readonly PlanEdge[];
  /** Node id by power-flow index. */
  readonly flowIds: readonly string[];
  /** Power-flow index by node id; a rung id maps to its root series. */
  readonly flowIndex: ReadonlyMap<string, number>;
  /** Element count, for sizing and benchmarks. */
  readonly elementCount: number;
  /** Nodes of each kind, counted while lowering (the module's size bound needs no other walk). */
  readonly nodeCounts: Readonly<Record<PlanOp, number>>;
}

/** Lay the three areas out one after another in a single bit image. */
export function bitLayout(space: AddressSpace): BitLayout {
  return {
    inputs: 0,
    outputs: space.inputs,
    memory: space.inputs + space.outputs,
    size: space.inputs + space.outputs + space.memory,
  };
}

/** The rungs as objects, from the node table (`Plan.rungs`); `rungs` are the program's. */
export function rungsFromNodes(
  rungs: readonly Rung[],
  nodes: PlanNodes,
  flowIds: readonly string[],
  sources: readonly PlanSource[],
  blocks: readonly PlanBlock[],
): PlanRung[] {
  const { data } = nodes;
  let next = 0;
  const children = (count: number): PlanNode[] => {
    const list: PlanNode[] = [];
    for (let k = 0; k < count; k += 1) list.push(node());
    return list;
  };
  const node = (): PlanNode => {
    const flow = next;
    next += 1;
    const base = NODE_STRIDE * flow;
    const a = data[base + 1]!;
    const id = flowIds[flow]!;
    switch (data[base]) {
      case NODE_OP.series:
        return { op: 'series', id, flow, items: children(a) };
      case NODE_OP.parallel:
        return { op: 'parallel', id, flow, branches: children(a) };
      case NODE_OP.contact:
        return { op: 'contact', id, flow, variant: CONTACT_VARIANTS[a]!, source: sources[data[base + 2]!]!, edge: data[base + 3]! };
      case NODE_OP.coil:
        return { op: 'coil', id, flow, variant: COIL_VARIANTS[a]!, bit: data[base + 2]!, edge: data[base + 3]! };
      default:
        return blocks[a]!;
    }
  };
  return rungs.map((rung, r): PlanRung => {
    next = nodes.roots[r]!;
    return { id: rung.id, network: node() as PlanSeries };
  });
}
