/**
 * The plan interpreter: runs the rungs without generated code, so it works under a Content
 * Security Policy that forbids `eval`. The plan is turned once into a tree of small closures over
 * the runtime's memory (one per node, chosen from a table keyed by node kind), which is several
 * times faster than walking the plan on every scan. The same builder can record the power flow on
 * both sides of every node, for the live view.
 */
import { BLOCK_BEHAVIOURS, readMember, type BlockBehaviour, type BlockState } from './blocks/behaviours';
import { COIL_WRITES, CONTACT_PASSES, type Memory } from './memory';
import type { Plan, PlanNode, PlanOp, PlanSource } from './plan';

/** Power flow per node, indexed by `PlanNode.flow`: 1 where energised. */
export interface FlowRecord {
  readonly left: Uint8Array;
  readonly right: Uint8Array;
}

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
    const { bits, edges } = memory;
    const passes = CONTACT_PASSES[node.variant];
    if (node.edge < 0 && node.source.kind === 'bit') {
      const bit = node.source.bit;
      return node.variant === 'nc' ? (left) => left & (bits[bit]! ^ 1) : (left) => left & bits[bit]!;
    }
    const read = sourceReader(node.source, memory);
    if (node.edge < 0) return (left) => left & passes(read(), 0);
    const edge = node.edge;
    return (left) => {
      const value = read();
      const passed = passes(value, edges[edge]!);
      edges[edge] = value;
      return left & passed;
    };
  },
  coil: (node, { memory }) => {
    const { bits, keep, forced } = memory;
    const write = COIL_WRITES[node.variant];
    const bit = node.bit;
    return (left) => {
      bits[bit] = (write(left, bits[bit]!) & keep[bit]!) | forced[bit]!;
      return left;
    };
  },
  block: (node, { memory, frame }) => {
    const { states } = memory;
    const behaviour = BLOCK_BEHAVIOURS[node.type] as unknown as BlockBehaviour<BlockState, Record<string, boolean | number>>;
    // One input record per call site, refilled on every call: a step only reads it during the call.
    const record: Record<string, boolean | number> = { [node.powerIn]: false };
    const inputs = node.inputs.map((input) => ({ name: input.name, bool: input.type === 'BOOL', read: sourceReader(input.source, memory) }));
    for (const input of inputs) record[input.name] = input.bool ? false : 0;
    const { instance, powerIn, powerOut, chargesTime } = node;
    return (left) => {
      record[powerIn] = left === 1;
      for (let i = 0; i < inputs.length; i += 1) {
        const input = inputs[i]!;
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
 * Build the solver for a plan over `memory`: each call solves every rung once, top to bottom, each
 * from a left rail that is ON (IEC 61131-3 clause 8.2.7 [memory for the sub-number]); a coil's write
 * is visible at once to every later element. With `flow`, the power on both sides of every node is
 * recorded as it is solved.
 */
export function buildRungSolver(plan: Plan, memory: Memory, flow: FlowRecord | null = null): RungSolver {
  const frame = { dtMs: 0 };
  const rungs = plan.rungs.map((rung) => build(rung.network, { memory, frame, flow }));
  return (dtMs) => {
    frame.dtMs = dtMs;
    for (let i = 0; i < rungs.length; i += 1) rungs[i]!(1);
  };
}
