/**
 * The plan interpreter: solves the rungs of one scan by walking the plan, with no generated code,
 * so it runs under a Content Security Policy that forbids `eval`. It can also record the power flow
 * on both sides of every node, which the live view reads.
 */
import { stepBlock, readMember } from './blocks/behaviours';
import { COIL_WRITES, CONTACT_PASSES, type Memory } from './memory';
import type { Plan, PlanNode, PlanOp, PlanSource } from './plan';

/** Power flow per node, indexed by `PlanNode.flow`: 1 where energised. */
export interface FlowRecord {
  readonly left: Uint8Array;
  readonly right: Uint8Array;
}

interface Solving {
  readonly memory: Memory;
  readonly dtMs: number;
  readonly flow: FlowRecord | null;
}

/** A source's current value as a number (BOOL 0/1, TIME ms, INT). */
export function readSource(source: PlanSource, memory: Memory): number {
  switch (source.kind) {
    case 'bit':
      return memory.bits[source.bit]!;
    case 'member': {
      const value = readMember(memory.states[source.instance]!, source.member);
      return typeof value === 'boolean' ? (value ? 1 : 0) : (value ?? 0);
    }
    case 'constant':
      return source.value;
  }
}

type Solver<N extends PlanNode> = (node: N, left: number, solving: Solving) => number;

const SOLVERS = {
  series: (node, left, solving) => {
    let power = left;
    for (const item of node.items) power = solve(item, power, solving);
    return power;
  },
  parallel: (node, left, solving) => {
    let power = 0;
    for (const branch of node.branches) power |= solve(branch, left, solving);
    return power;
  },
  contact: (node, left, { memory }) => {
    const value = readSource(node.source, memory);
    if (node.edge < 0) return left & CONTACT_PASSES[node.variant](value, 0);
    const passes = CONTACT_PASSES[node.variant](value, memory.edges[node.edge]!);
    memory.edges[node.edge] = value;
    return left & passes;
  },
  coil: (node, left, { memory }) => {
    const { bits, keep, forced } = memory;
    bits[node.bit] = (COIL_WRITES[node.variant](left, bits[node.bit]!) & keep[node.bit]!) | forced[node.bit]!;
    return left;
  },
  block: (node, left, { memory, dtMs }) => {
    const inputs: Record<string, boolean | number> = { [node.powerIn]: left === 1 };
    for (const input of node.inputs) {
      const value = readSource(input.source, memory);
      inputs[input.name] = input.type === 'BOOL' ? value !== 0 : value;
    }
    const state = stepBlock(node.type, memory.states[node.instance]!, inputs, node.chargesTime ? dtMs : 0);
    memory.states[node.instance] = state;
    return readMember(state, node.powerOut) === true ? 1 : 0;
  },
} as const satisfies { [K in PlanOp]: Solver<Extract<PlanNode, { op: K }>> };

function solve(node: PlanNode, left: number, solving: Solving): number {
  const right = (SOLVERS[node.op] as Solver<PlanNode>)(node, left, solving);
  if (solving.flow !== null) {
    solving.flow.left[node.flow] = left;
    solving.flow.right[node.flow] = right;
  }
  return right;
}

/**
 * Solve every rung once, top to bottom, each from a left rail that is ON (IEC 61131-3 clause 8.2.7
 * [memory for the sub-number]). A coil's write is visible at once to every later element.
 */
export function solveRungs(plan: Plan, memory: Memory, dtMs: number, flow: FlowRecord | null = null): void {
  const solving: Solving = { memory, dtMs, flow };
  for (const rung of plan.rungs) solve(rung.network, 1, solving);
}
