/**
 * A machine: one runtime's WebAssembly memory (laid out by `stateLayout.ts`) and the kernels that
 * scan it. Kernel modules are compiled once per plan and shared by every machine of that plan (a
 * grading server runs many side by side). There are four variants, each compiled on first use:
 * with or without the power-flow record (only when someone watches), and with or without forces
 * (a write into a forced bit must not take effect; checking that on every write cost the 3-rung
 * demo a third of its scan in Chromium, so the check is compiled in only while a bit is forced).
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
  /**
   * The kernel that records power flow or not, and that honours forces or not (instantiated on
   * first use). The one without forces is right only while no bit is forced.
   */
  kernel(recordFlow: boolean, forces: boolean): ScanKernel;
}

interface PlanModules {
  readonly layout: StateLayout;
  /** By variant: 1 = records power flow, 2 = honours forces. */
  readonly variants: Array<WasmModule | undefined>;
}

const variantOf = (recordFlow: boolean, forces: boolean): number => (recordFlow ? 1 : 0) | (forces ? 2 : 0);

/** Compiled modules by plan: plans are immutable, so a plan's modules never change. */
const modulesByPlan = new WeakMap<Plan, PlanModules>();

function modulesOf(plan: Plan): PlanModules {
  let modules = modulesByPlan.get(plan);
  if (modules === undefined) {
    modules = { layout: stateLayout(plan), variants: [] };
    modulesByPlan.set(plan, modules);
  }
  return modules;
}

function moduleOf(plan: Plan, recordFlow: boolean, forces: boolean): WasmModule {
  const { layout, variants } = modulesOf(plan);
  const variant = variantOf(recordFlow, forces);
  return (variants[variant] ??= compileWasm(kernelModule(plan, layout, { recordFlow, forces })));
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
  const kernels: Array<ScanKernel | undefined> = [];
  const machine: Machine = {
    plan,
    layout,
    bytes,
    cells,
    numbers,
    kernel(recordFlow, forces) {
      return (kernels[variantOf(recordFlow, forces)] ??= instantiateKernel(moduleOf(plan, recordFlow, forces), memory));
    },
  };
  cells.fill(1, layout.keep / 4, layout.keep / 4 + plan.layout.size);
  plan.instances.forEach((instance, i) => writeRecord(machine, i, BLOCK_BEHAVIOURS[instance.type].initial));
  return machine;
}

/** The field value of input `i` (0-based), 0 or 1. */
export function readField(machine: Machine, i: number): number {
  return (machine.cells[(machine.layout.field >> 2) + (i >> 5)]! >>> (i & 31)) & 1;
}

/** Set the field value of input `i` (0-based). */
export function writeField(machine: Machine, i: number, value: boolean): void {
  const at = (machine.layout.field >> 2) + (i >> 5);
  const bit = 1 << (i & 31);
  const cells = machine.cells;
  cells[at] = value ? cells[at]! | bit : cells[at]! & ~bit;
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
