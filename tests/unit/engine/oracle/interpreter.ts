/**
 * The reference interpreter, the engine's test oracle: it walks the plan with the reference
 * semantics of `shared/engine` (`CONTACT_KINDS.passes`, `COIL_KINDS.writes`, the blocks' pure
 * `step` functions) instead of running the WebAssembly the engine emits from the same plan. The
 * plan is turned once into a tree of small closures over the memory (one per node, from a table
 * keyed by node kind); with `flow`, the power on both sides of every node is recorded.
 */
import { BLOCK_BEHAVIOURS, readMember, type BlockBehaviour, type BlockState } from '@shared/engine/blocks/behaviours';
import { COIL_KINDS, CONTACT_KINDS, type CoilKind, type ContactKind } from '@shared/engine/elements';
import type { Plan, PlanNode, PlanOp, PlanSource } from '@shared/engine/plan';
import type { FlowRecord } from '@shared/engine/powerFlow';
import type { Memory } from './memory';

/** Solves the rungs of one scan over the memory it was built for. */
export type RungSolver = (dtMs: number) => void;

/** One node: power on its left in, power on its right out (0/1). */
type NodeSolver = (left: number) => number;

interface Building {
  readonly memory: Memory;
  /** The scan period of the scan being solved, set before each scan. */
  readonly frame: { dtMs: number };
  readonly flow: FlowRecord | null;
}

/** Reads a source's value as a number (BOOL 0/1, TIME ms, INT). */
function sourceReader(source: PlanSource, memory: Memory): () => number {
  switch (source.kind) {
    case 'bit': {
      const { bits } = memory;
      const bit = source.bit;
      return () => bits[bit]!;
    }
    case 'member': {
      const { states } = memory;
      const { instance, member } = source;
      return () => {
        const value = readMember(states[instance]!, member);
        return typeof value === 'boolean' ? (value ? 1 : 0) : (value ?? 0);
      };
    }
    case 'constant': {
      const value = source.value;
      return () => value;
    }
  }
}

type Builder<N extends PlanNode> = (node: N, building: Building) => NodeSolver;

const BUILDERS = {
  series: (node, building) => {
    const items = node.items.map((item) => build(item, building));
    return (left) => {
      let power = left;
      for (let i = 0; i < items.length; i += 1) power = items[i]!(power);
      return power;
    };
  },
  parallel: (node, building) => {
    const branches = node.branches.map((branch) => build(branch, building));
    return (left) => {
      let power = 0;
      for (let i = 0; i < branches.length; i += 1) power |= branches[i]!(left);
      return power;
    };
  },
  contact: (node, { memory }) => {
    const { edges } = memory;
    const kind: ContactKind = CONTACT_KINDS[node.variant];
    const read = sourceReader(node.source, memory);
    if (!kind.edge) return (left) => left & kind.passes(read(), 0);
    const edge = node.edge;
    return (left) => {
      const value = read();
      const passed = kind.passes(value, edges[edge]!);
      edges[edge] = value;
      return left & passed;
    };
  },
  coil: (node, { memory }) => {
    const { bits, edges, keep, forced } = memory;
    const kind: CoilKind = COIL_KINDS[node.variant];
    const { bit, edge } = node;
    return (left) => {
      bits[bit] = (kind.writes(left, bits[bit]!, kind.edge ? edges[edge]! : 0) & keep[bit]!) | forced[bit]!;
      if (kind.edge) edges[edge] = left;
      return left;
    };
  },
  block: (node, { memory, frame }) => {
    const { states } = memory;
    const behaviour = BLOCK_BEHAVIOURS[node.type] as unknown as BlockBehaviour<BlockState, Record<string, boolean | number>>;
    const inputs = node.inputs.map((input) => ({ name: input.name, bool: input.type === 'BOOL', read: sourceReader(input.source, memory) }));
    const { instance, powerIn, powerOut, chargesTime } = node;
    return (left) => {
      const record: Record<string, boolean | number> = { [powerIn]: left === 1 };
      for (const input of inputs) {
        const value = input.read();
        record[input.name] = input.bool ? value !== 0 : value;
      }
      const state = behaviour.step(states[instance]!, record, chargesTime ? frame.dtMs : 0);
      states[instance] = state;
      return readMember(state, powerOut) === true ? 1 : 0;
    };
  },
} as const satisfies { [K in PlanOp]: Builder<Extract<PlanNode, { op: K }>> };

function build(node: PlanNode, building: Building): NodeSolver {
  const solve = (BUILDERS[node.op] as Builder<PlanNode>)(node, building);
  const flow = building.flow;
  if (flow === null) return solve;
  const at = node.flow;
  return (left) => {
    const right = solve(left);
    flow.left[at] = left;
    flow.right[at] = right;
    return right;
  };
}

/**
 * The solver for a plan over `memory`: each call solves every rung once, top to bottom, each from
 * a left rail that is ON (IEC 61131-3 clause 8.2.7 [memory for the sub-number]); a coil's write
 * is visible at once to every later element.
 */
export function buildRungSolver(plan: Plan, memory: Memory, flow: FlowRecord | null = null): RungSolver {
  const frame = { dtMs: 0 };
  const rungs = plan.rungs.map((rung) => build(rung.network, { memory, frame, flow }));
  return (dtMs) => {
    frame.dtMs = dtMs;
    for (let i = 0; i < rungs.length; i += 1) rungs[i]!(1);
  };
}
