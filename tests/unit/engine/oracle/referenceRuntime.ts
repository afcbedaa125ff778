/**
 * A reference runtime over the oracle interpreter: the scan cycle of `shared/engine/runtime.ts`
 * (input image with forces, rungs, output image, time) with the reference semantics, and the
 * engine's snapshot format, so a test can compare the engine with it state for state.
 */
import type { Plan } from '@shared/engine/plan';
import type { FlowRecord } from '@shared/engine/powerFlow';
import type { RuntimeSnapshot } from '@shared/engine/snapshot';
import { SNAPSHOT_FORMAT } from '@shared/engine/snapshot';
import { resolveBit } from '@shared/engine/operandAccess';
import { formatAddress } from '@shared/ladder/addresses';
import { buildRungSolver } from './interpreter';
import { createMemory } from './memory';

export interface ReferenceRuntime {
  setInput(index: number, value: boolean): void;
  force(operand: string, value: boolean): void;
  clearForces(): void;
  scan(): void;
  snapshot(): RuntimeSnapshot;
  /** Power on both sides of every node in the last scan. */
  readonly flow: FlowRecord;
}

export function createReferenceRuntime(plan: Plan, scanMs = 10): ReferenceRuntime {
  const memory = createMemory(plan);
  const flow = { left: new Uint8Array(plan.flowIds.length), right: new Uint8Array(plan.flowIds.length) };
  const solve = buildRungSolver(plan, memory, flow);
  const { layout, space } = plan;
  const field = new Uint8Array(space.inputs);
  const outputImage = new Uint8Array(space.outputs);
  const forces = new Map<string, { bit: number; value: boolean }>();
  let scanCount = 0;
  let timeMs = 0;
  const area = (from: number, to: number) => Array.from(memory.bits.subarray(from, to));
  return {
    flow,
    setInput: (index, value) => {
      field[index - 1] = value ? 1 : 0;
    },
    force(operand, value) {
      const bit = resolveBit(plan, operand);
      if (!bit.ok) throw new Error(bit.error);
      forces.set(formatAddress(bit.value.address), { bit: bit.value.bit, value });
      const b = bit.value.bit;
      memory.keep[b] = 0;
      memory.forced[b] = value ? 1 : 0;
      memory.bits[b] = value ? 1 : 0;
      if (b >= layout.outputs && b < layout.memory) outputImage[b - layout.outputs] = value ? 1 : 0;
    },
    clearForces() {
      for (const { bit } of forces.values()) {
        memory.keep[bit] = 1;
        memory.forced[bit] = 0;
      }
      forces.clear();
    },
    scan() {
      const { bits, keep, forced } = memory;
      for (let i = 0; i < space.inputs; i += 1) bits[layout.inputs + i] = (field[i]! & keep[layout.inputs + i]!) | forced[layout.inputs + i]!;
      solve(scanMs);
      for (let i = 0; i < space.outputs; i += 1) outputImage[i] = bits[layout.outputs + i]!;
      scanCount += 1;
      timeMs += scanMs;
    },
    snapshot: () => ({
      format: SNAPSHOT_FORMAT,
      version: 1,
      scanMs,
      scanCount,
      timeMs,
      space: { ...space },
      field: Array.from(field),
      bits: { inputs: area(layout.inputs, layout.outputs), outputs: area(layout.outputs, layout.memory), memory: area(layout.memory, layout.size) },
      outputImage: Array.from(outputImage),
      edges: plan.edges.map((edge, i) => ({ elementId: edge.elementId, operand: edge.operand, value: memory.edges[i]! })),
      instances: plan.instances.map((instance, i) => ({ name: instance.name, type: instance.type, state: memory.states[i]! })),
      forces: [...forces].map(([address, { value }]) => ({ address, value })),
    }),
  };
}
