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
import { createMachine, writeField, type Machine, type ScanKernel } from './machine';
import { resolveBit, resolveReader, type Reader } from './operandAccess';
import type { Plan } from './plan';
import { createPowerFlowView, type PowerFlowView } from './powerFlow';
import { checkScanMs, DEFAULT_SCAN_MS, type Runtime, type RuntimeOptions, type SavedState } from './runtime';
import { leapTimers, quietScans } from './leap';
import { losePower, warmRestart, type RetainedValues } from './restart';
import { applySnapshot, takeSnapshot, type RestoreReport, type RuntimeSnapshot } from './snapshot';

/** Start a runtime on a plan: every bit FALSE, every block fresh, time 0. */
export function createRuntime(plan: Plan, options: RuntimeOptions = {}): Runtime {
  const scanMs = options.scanMs ?? DEFAULT_SCAN_MS;
  const checked = checkScanMs(scanMs);
  if (!checked.ok) throw new RangeError(checked.error);
  return new ScanRuntime(plan, scanMs, options.recordPowerFlow === true);
}

class ScanRuntime implements Runtime, RuntimeCore {
  readonly plan: Plan;
  readonly scanMs: number;
  scanCount = 0;
  timeMs = 0;
  forcedBits = new Map<string, ForcedBit>();
  readonly machine: Machine;
  private kernel: ScanKernel;
  private recording: boolean;
  /**
   * The flow record is valid after a later scan than this one: the scan count when recording
   * began or the state was last replaced. (Kept as a number, so a scan itself writes nothing.)
   */
  private flowSince = 0;
  private flowCache: PowerFlowView | null = null;
  /** What the retained variables held when power was lost; null while the controller has power. */
  private kept: RetainedValues | null = null;
  /** The running timers' ET cells found by the last `quietScans`. */
  private running: readonly number[] = [];
  private readonly readers = new Map<string, Reader | null>();
  /** The cell index of the first field word (inputs %IX1..%IX32; %IX33..%IX64 in the next). */
  private readonly fieldCell: number;
  /** The machine's memory as cells, and the panel's input count (read on every `setInputs`). */
  private readonly cells: Int32Array;
  private readonly inputs: number;

  constructor(plan: Plan, scanMs: number, recordFlow: boolean) {
    this.plan = plan;
    this.scanMs = scanMs;
    this.machine = createMachine(plan);
    this.fieldCell = this.machine.layout.field >> 2;
    this.cells = this.machine.cells;
    this.inputs = plan.space.inputs;
    this.recording = recordFlow;
    this.kernel = this.machine.kernel(recordFlow, false);
  }

  setInput(index: number, value: boolean): void {
    const inputs = this.inputs;
    if (!(index >= 1 && index <= inputs && Number.isInteger(index))) checkIndex(index, inputs, 'setInput', '%IX');
    writeField(this.machine, index - 1, value);
  }

  // The inputs are packed into words here and given in one store per 32 (the kernel unpacks
  // them): a store per input into the WebAssembly memory cost the 3-rung demo a fifth of its scan.
  setInputs(values: ArrayLike<boolean>): void {
    const inputs = this.inputs;
    const n = values.length < inputs ? values.length : inputs;
    const cells = this.cells;
    const at = this.fieldCell;
    // Inputs past the end of `values` keep their field value.
    if (n <= 32) {
      const word = packBits(values, 0, n);
      cells[at] = n === inputs || n === 32 ? word : (cells[at]! & (-1 << n)) | word;
      return;
    }
    cells[at] = packBits(values, 0, 32);
    const word = packBits(values, 32, n);
    cells[at + 1] = n === inputs || n === 64 ? word : (cells[at + 1]! & (-1 << (n - 32))) | word;
  }

  getOutput(index: number): boolean {
    const outputs = this.plan.space.outputs;
    if (!(index >= 1 && index <= outputs && Number.isInteger(index))) checkIndex(index, outputs, 'getOutput', '%QX');
    // Without power every output is open, a forced one too.
    if (this.kept !== null) return false;
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

  get powered(): boolean {
    return this.kept === null;
  }

  powerOff(): void {
    if (this.kept !== null) return;
    this.kept = losePower(this.machine);
    this.stateReplaced();
  }

  powerOn(): void {
    if (this.kept === null) return;
    warmRestart(this.machine, this.kept);
    this.inputImageChanged();
    this.kept = null;
    this.stateReplaced();
  }

  scan(): void {
    if (this.kept === null) this.kernel(this.scanMs);
    this.scanCount += 1;
    this.timeMs += this.scanMs;
  }

  run(ms: number): void {
    if (!Number.isFinite(ms) || ms < 0) throw new RangeError(`run: the time must be a number of ms ≥ 0, not ${String(ms)}`);
    const scans = Math.ceil(ms / this.scanMs);
    for (let i = 0; i < scans; i += 1) this.scan();
  }

  force(operand: string, value: boolean): Result<void> {
    const bit = resolveBit(this.plan, operand);
    if (!bit.ok) return bit;
    this.setForces(new Map(this.forcedBits).set(formatAddress(bit.value.address), { bit: bit.value.bit, value }));
    this.forceBit(bit.value.bit, value);
    return ok(undefined);
  }

  unforce(operand: string): void {
    const bit = resolveBit(this.plan, operand);
    if (!bit.ok) return;
    const key = formatAddress(bit.value.address);
    if (!this.forcedBits.has(key)) return;
    const forces = new Map(this.forcedBits);
    forces.delete(key);
    this.setForces(forces);
    this.releaseBit(bit.value.bit);
  }

  clearForces(): void {
    if (this.forcedBits.size === 0) return;
    for (const { bit } of this.forcedBits.values()) this.releaseBit(bit);
    this.setForces(new Map());
  }

  forces(): ReadonlyMap<string, boolean> {
    return new Map([...this.forcedBits].map(([key, { value }]) => [key, value]));
  }

  powerFlow(): PowerFlowView {
    if (!this.recording) {
      this.recording = true;
      this.flowSince = this.scanCount;
      this.chooseKernel();
    }
    const valid = this.kept === null && this.scanCount > this.flowSince;
    const cached = this.flowCache;
    if (cached !== null && cached.scanCount === this.scanCount && cached.recorded === valid) return cached;
    const { cells, layout } = this.machine;
    const nodes = this.plan.flowIds.length;
    const side = (at: number): Uint8Array => Uint8Array.from(cells.subarray(at / 4, at / 4 + nodes));
    const record = valid ? { left: side(layout.flowLeft), right: side(layout.flowRight) } : { left: new Uint8Array(nodes), right: new Uint8Array(nodes) };
    this.flowCache = createPowerFlowView(this.plan, record, this.scanCount, valid);
    return this.flowCache;
  }

  snapshot(): RuntimeSnapshot {
    return takeSnapshot(this);
  }

  restore(snapshot: RuntimeSnapshot): RestoreReport {
    const report = applySnapshot(this, snapshot, (bit, value) => this.forceBit(bit, value));
    this.inputImageChanged();
    this.chooseKernel();
    this.stateReplaced();
    return report;
  }

  saveState(into?: SavedState): SavedState {
    const { bytes, layout } = this.machine;
    const state = into ?? { bytes: new Uint8Array(layout.stateBytes), scanCount: 0, timeMs: 0, forces: this.forcedBits };
    state.bytes.set(bytes.subarray(0, layout.stateBytes));
    state.scanCount = this.scanCount;
    state.timeMs = this.timeMs;
    state.forces = this.forcedBits;
    return state;
  }

  loadState(state: SavedState): void {
    if (state.bytes.length !== this.machine.layout.stateBytes) throw new RangeError('loadState: a state of another plan');
    this.machine.bytes.set(state.bytes);
    this.scanCount = state.scanCount;
    this.timeMs = state.timeMs;
    // Force maps are never changed once made (see setForces), so sharing one is safe.
    this.forcedBits = state.forces as Map<string, ForcedBit>;
    this.chooseKernel();
    this.stateReplaced();
  }

  quietScans(before: SavedState, timers = true): number {
    const quiet = quietScans(this.machine, before.bytes, this.scanMs, timers);
    this.running = quiet.running;
    return quiet.scans;
  }

  leap(scans: number): void {
    if (!(Number.isInteger(scans) && scans >= 0)) throw new RangeError(`leap: a whole number of scans ≥ 0, not ${String(scans)}`);
    leapTimers(this.machine, this.running, scans, this.scanMs);
    this.scanCount += scans;
    this.timeMs += scans * this.scanMs;
    // The power flow of a quiet scan is the last one's; only its scan number moves on.
    this.flowCache = null;
  }

  /** Forces are replaced, never changed in place, so a saved state can share its map. */
  private setForces(forces: Map<string, ForcedBit>): void {
    this.forcedBits = forces;
    this.chooseKernel();
  }

  /** The kernel for what the runtime now needs: power flow if someone watches, forces if any. */
  private chooseKernel(): void {
    this.kernel = this.machine.kernel(this.recording, this.forcedBits.size > 0);
  }

  private stateReplaced(): void {
    this.flowSince = this.scanCount;
    this.flowCache = null;
  }

  /**
   * The input image was written outside the kernel (a force, a restore, a restart), so it may no
   * longer be the field words it was last spread from: the next scan spreads them again.
   */
  private inputImageChanged(): void {
    this.cells[this.machine.layout.copiedValid / 4] = 0;
  }

  private forceBit(bit: number, value: boolean): void {
    const { cells, layout } = this.machine;
    const v = value ? 1 : 0;
    cells[layout.keep / 4 + bit] = 0;
    cells[layout.forced / 4 + bit] = v;
    cells[bit] = v;
    this.inputImageChanged();
  }

  private releaseBit(bit: number): void {
    const { cells, layout } = this.machine;
    cells[layout.keep / 4 + bit] = 1;
    cells[layout.forced / 4 + bit] = 0;
    this.inputImageChanged();
  }
}

/**
 * `values[from..to)` as the bits of a word (bit 0 = `values[from]`, at most 32). Four at a time:
 * Chromium ran it 1.4 ns faster per 8 inputs than one at a time.
 */
function packBits(values: ArrayLike<boolean>, from: number, to: number): number {
  let word = 0;
  let i = from;
  for (; i + 4 <= to; i += 4) {
    word |= ((values[i] ? 1 : 0) | (values[i + 1] ? 2 : 0) | (values[i + 2] ? 4 : 0) | (values[i + 3] ? 8 : 0)) << (i - from);
  }
  for (; i < to; i += 1) word |= (values[i] ? 1 : 0) << (i - from);
  return word;
}

function checkIndex(index: number, size: number, what: string, prefix: string): void {
  if (!Number.isInteger(index) || index < 1 || index > size) {
    throw new RangeError(`${what}: ${prefix}${String(index)} does not exist; this panel has ${prefix}1..${prefix}${size}`);
  }
}
