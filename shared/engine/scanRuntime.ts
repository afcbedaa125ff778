/**
 * `createRuntime` and `ScanRuntime`, the class behind it (runtime.ts has the contract and the scan
 * cycle). A class, so that every instance shares one set of methods: a grading server runs many
 * runtimes side by side, and shared methods stay fast there. A scan is one call into the
 * WebAssembly kernel (`kernel.ts`), which reads the field values and forces from the machine's
 * memory and writes the output image back there; the runtime only counts scans and time.
 */
import { formatAddress } from '../ladder/addresses';
import { ok, type Result } from '../ladder/result';
import type { ForcedBit, RuntimeCore } from './core';
import { createMachine, type Machine, type ScanKernel } from './machine';
import { resolveBit, resolveReader, type Reader } from './operandAccess';
import type { Plan } from './plan';
import { createPowerFlowView, type PowerFlowView } from './powerFlow';
import { checkScanMs, DEFAULT_SCAN_MS, type Runtime, type RuntimeOptions, type SavedState } from './runtime';
import { applySnapshot, takeSnapshot, type RestoreReport, type RuntimeSnapshot } from './snapshot';

/** Start a runtime on a plan: every bit FALSE, every block fresh, time 0. */
export function createRuntime(plan: Plan, options: RuntimeOptions = {}): Runtime {
  const scanMs = options.scanMs ?? DEFAULT_SCAN_MS;
  const checked = checkScanMs(scanMs);
  if (!checked.ok) throw new RangeError(checked.error);
  return new ScanRuntime(plan, scanMs, options.recordPowerFlow === true);
}

class ScanRuntime implements Runtime {
  readonly plan: Plan;
  readonly scanMs: number;
  private readonly core: RuntimeCore;
  private readonly machine: Machine;
  private kernel: ScanKernel;
  private recording: boolean;
  /** The last scan ran the recording kernel, and nothing has replaced the state since. */
  private flowValid = false;
  private flowCache: PowerFlowView | null = null;
  private readonly readers = new Map<string, Reader | null>();
  /** The field value cells, one per input (index 0 = %IX1). */
  private readonly field: Int32Array;

  constructor(plan: Plan, scanMs: number, recordFlow: boolean) {
    this.plan = plan;
    this.scanMs = scanMs;
    this.machine = createMachine(plan);
    this.field = this.machine.cells.subarray(this.machine.layout.field / 4, this.machine.layout.field / 4 + plan.space.inputs);
    this.core = { plan, scanMs, machine: this.machine, forces: new Map(), scanCount: 0, timeMs: 0 };
    this.recording = recordFlow;
    this.kernel = this.machine.kernel(recordFlow);
  }

  get scanCount(): number {
    return this.core.scanCount;
  }

  get timeMs(): number {
    return this.core.timeMs;
  }

  setInput(index: number, value: boolean): void {
    const inputs = this.plan.space.inputs;
    if (!(index >= 1 && index <= inputs && Number.isInteger(index))) checkIndex(index, inputs, 'setInput', '%IX');
    this.field[index - 1] = value ? 1 : 0;
  }

  setInputs(values: ArrayLike<boolean>): void {
    const field = this.field;
    const n = values.length < field.length ? values.length : field.length;
    for (let i = 0; i < n; i += 1) field[i] = values[i] ? 1 : 0;
  }

  getOutput(index: number): boolean {
    const outputs = this.plan.space.outputs;
    if (!(index >= 1 && index <= outputs && Number.isInteger(index))) checkIndex(index, outputs, 'getOutput', '%QX');
    return this.machine.cells[this.plan.layout.outputs + index - 1] === 1;
  }

  read(operand: string): boolean | number | undefined {
    let reader = this.readers.get(operand);
    if (reader === undefined) {
      if (this.readers.size > 1000) this.readers.clear();
      reader = resolveReader(this.plan, operand);
      this.readers.set(operand, reader);
    }
    return reader === null ? undefined : reader(this.machine);
  }

  scan(): void {
    this.kernel(this.scanMs);
    this.flowValid = this.recording;
    const core = this.core;
    core.scanCount += 1;
    core.timeMs += this.scanMs;
  }

  run(ms: number): void {
    if (!Number.isFinite(ms) || ms < 0) throw new RangeError(`run: the time must be a number of ms ≥ 0, not ${String(ms)}`);
    const scans = Math.ceil(ms / this.scanMs);
    for (let i = 0; i < scans; i += 1) this.scan();
  }

  force(operand: string, value: boolean): Result<void> {
    const bit = resolveBit(this.plan, operand);
    if (!bit.ok) return bit;
    this.setForces(new Map(this.core.forces).set(formatAddress(bit.value.address), { bit: bit.value.bit, value }));
    this.forceBit(bit.value.bit, value);
    return ok(undefined);
  }

  unforce(operand: string): void {
    const bit = resolveBit(this.plan, operand);
    if (!bit.ok) return;
    const key = formatAddress(bit.value.address);
    if (!this.core.forces.has(key)) return;
    const forces = new Map(this.core.forces);
    forces.delete(key);
    this.setForces(forces);
    this.releaseBit(bit.value.bit);
  }

  clearForces(): void {
    if (this.core.forces.size === 0) return;
    for (const { bit } of this.core.forces.values()) this.releaseBit(bit);
    this.setForces(new Map());
  }

  forces(): ReadonlyMap<string, boolean> {
    return new Map([...this.core.forces].map(([key, { value }]) => [key, value]));
  }

  powerFlow(): PowerFlowView {
    const core = this.core;
    if (!this.recording) {
      this.recording = true;
      this.kernel = this.machine.kernel(true);
    }
    const cached = this.flowCache;
    if (cached !== null && cached.scanCount === core.scanCount && cached.recorded === this.flowValid) return cached;
    const { cells, layout } = this.machine;
    const nodes = this.plan.flowIds.length;
    const side = (at: number): Uint8Array => Uint8Array.from(cells.subarray(at / 4, at / 4 + nodes));
    const record = this.flowValid ? { left: side(layout.flowLeft), right: side(layout.flowRight) } : { left: new Uint8Array(nodes), right: new Uint8Array(nodes) };
    this.flowCache = createPowerFlowView(this.plan, record, core.scanCount, this.flowValid);
    return this.flowCache;
  }

  snapshot(): RuntimeSnapshot {
    return takeSnapshot(this.core);
  }

  restore(snapshot: RuntimeSnapshot): RestoreReport {
    const report = applySnapshot(this.core, snapshot, (bit, value) => this.forceBit(bit, value));
    this.stateReplaced();
    return report;
  }

  saveState(into?: SavedState): SavedState {
    const { bytes, layout } = this.machine;
    const core = this.core;
    const state = into ?? { bytes: new Uint8Array(layout.stateBytes), scanCount: 0, timeMs: 0, forces: core.forces };
    state.bytes.set(bytes.subarray(0, layout.stateBytes));
    state.scanCount = core.scanCount;
    state.timeMs = core.timeMs;
    state.forces = core.forces;
    return state;
  }

  loadState(state: SavedState): void {
    const core = this.core;
    if (state.bytes.length !== this.machine.layout.stateBytes) throw new RangeError('loadState: a state of another plan');
    this.machine.bytes.set(state.bytes);
    core.scanCount = state.scanCount;
    core.timeMs = state.timeMs;
    // Force maps are never changed once made (see setForces), so sharing one is safe.
    core.forces = state.forces as Map<string, ForcedBit>;
    this.stateReplaced();
  }

  /** Forces are replaced, never changed in place, so a saved state can share its map. */
  private setForces(forces: Map<string, ForcedBit>): void {
    this.core.forces = forces;
  }

  private stateReplaced(): void {
    this.flowValid = false;
    this.flowCache = null;
  }

  private forceBit(bit: number, value: boolean): void {
    const { cells, layout } = this.machine;
    const v = value ? 1 : 0;
    cells[layout.keep / 4 + bit] = 0;
    cells[layout.forced / 4 + bit] = v;
    cells[bit] = v;
  }

  private releaseBit(bit: number): void {
    const { cells, layout } = this.machine;
    cells[layout.keep / 4 + bit] = 1;
    cells[layout.forced / 4 + bit] = 0;
  }
}

function checkIndex(index: number, size: number, what: string, prefix: string): void {
  if (!Number.isInteger(index) || index < 1 || index > size) {
    throw new RangeError(`${what}: ${prefix}${String(index)} does not exist; this panel has ${prefix}1..${prefix}${size}`);
  }
}
