/**
 * A machine: one runtime's WebAssembly memory (laid out by `stateLayout.ts`) and the kernels that
 * scan it. Kernel modules are compiled once per plan and shared by every machine of that plan (a
 * grading server runs many side by side); the variant that records power flow is compiled only
 * when someone watches.
 */
import type { BlockState } from './blocks/behaviours';
import { BLOCK_BEHAVIOURS } from './blocks/behaviours';
import { kernelModule } from './kernel';
import type { Plan } from './plan';
import { stateLayout, type StateLayout } from './stateLayout';
import { compileWasm, createWasmMemory, instantiateKernel, type WasmModule } from './wasm/host';

/** Runs one scan's rungs over the machine's memory; `dtMs` is the scan period. */
export type ScanKernel = (dtMs: number) => void;

export interface Machine {
  readonly plan: Plan;
  readonly layout: StateLayout;
  /** The whole memory, byte by byte (for copying states). */
  readonly bytes: Uint8Array;
  /** The whole memory as i32 cells: the cell at byte address `a` is `cells[a / 4]`; bit `i` of the image is `cells[i]`. */
  readonly cells: Int32Array;
  /** The whole memory as doubles (a record's number at byte address `a` is `numbers[a / 8]`). */
  readonly numbers: Float64Array;
  /** The kernel that records power flow, or the one that does not (instantiated on first use). */
  kernel(recordFlow: boolean): ScanKernel;
}

interface PlanModules {
  readonly layout: StateLayout;
  plain: WasmModule | null;
  flow: WasmModule | null;
}

/** Compiled modules by plan: plans are immutable, so a plan's modules never change. */
const modulesByPlan = new WeakMap<Plan, PlanModules>();

function modulesOf(plan: Plan): PlanModules {
  let modules = modulesByPlan.get(plan);
  if (modules === undefined) {
    modules = { layout: stateLayout(plan), plain: null, flow: null };
    modulesByPlan.set(plan, modules);
  }
  return modules;
}

function moduleOf(plan: Plan, recordFlow: boolean): WasmModule {
  const modules = modulesOf(plan);
  const key = recordFlow ? 'flow' : 'plain';
  modules[key] ??= compileWasm(kernelModule(plan, modules.layout, { recordFlow }));
  return modules[key];
}

/** WebAssembly memory is little-endian, and the runtime reads it through typed arrays, which follow the host. */
const LITTLE_ENDIAN = new Uint8Array(new Int32Array([1]).buffer)[0] === 1;

/** A fresh machine: every bit FALSE, nothing forced, every block in its initial state. */
export function createMachine(plan: Plan): Machine {
  if (!LITTLE_ENDIAN) throw new Error('the scan engine runs only on a little-endian host');
  const { layout } = modulesOf(plan);
  const memory = createWasmMemory(layout.pages);
  const bytes = new Uint8Array(memory.buffer);
  const cells = new Int32Array(memory.buffer);
  const numbers = new Float64Array(memory.buffer);
  const kernels: [ScanKernel | null, ScanKernel | null] = [null, null];
  const machine: Machine = {
    plan,
    layout,
    bytes,
    cells,
    numbers,
    kernel(recordFlow) {
      const at = recordFlow ? 1 : 0;
      return (kernels[at] ??= instantiateKernel(moduleOf(plan, recordFlow), memory));
    },
  };
  cells.fill(1, layout.keep / 4, layout.keep / 4 + plan.layout.size);
  plan.instances.forEach((instance, i) => writeRecord(machine, i, BLOCK_BEHAVIOURS[instance.type].initial));
  return machine;
}

/** An instance's state as the plain object its step function takes (fields in the initial state's order). */
export function readRecord(machine: Machine, instance: number): BlockState {
  const { layout, cells, numbers } = machine;
  const base = layout.records[instance]!;
  const state: Record<string, boolean | number> = {};
  for (const field of layout.recordLayouts[instance]!.fields) {
    const at = base + field.offset;
    state[field.name] = field.kind === 'number' ? numbers[at / 8]! : cells[at / 4] === 1;
  }
  return state as unknown as BlockState;
}

/** Write an instance's state (one of its type, see `isStateOf`). */
export function writeRecord(machine: Machine, instance: number, state: BlockState): void {
  const { layout, cells, numbers } = machine;
  const base = layout.records[instance]!;
  const values = state as unknown as Record<string, boolean | number>;
  for (const field of layout.recordLayouts[instance]!.fields) {
    const at = base + field.offset;
    if (field.kind === 'number') numbers[at / 8] = values[field.name] as number;
    else cells[at / 4] = values[field.name] === true ? 1 : 0;
  }
}
