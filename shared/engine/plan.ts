/**
 * The executable plan: a validated program lowered onto typed memory. Every operand is resolved to
 * a numeric index (a bit of the image, a block instance, an edge memory) or a constant, so running
 * a plan never looks at text a user typed. The kernel (`kernel.ts`) is emitted from this alone.
 */
import type { AddressSpace } from '../ladder/addresses';
import type { ParamType } from '../ladder/blocks';
import type { SymbolTable } from '../ladder/operands';
import type { BlockType, CoilVariant, ContactVariant, Program } from '../ladder/schema';

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
  readonly rungs: readonly PlanRung[];
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
