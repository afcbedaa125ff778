/**
 * The runtime: one simulated controller running a plan in virtual time. A scan is
 *   1. input image ← the field inputs (an input force overrides the field value),
 *   2. solve the rungs top to bottom (a coil's write is seen at once by later rungs; a forced
 *      output or memory bit keeps its forced value whatever the coil says),
 *   3. output image ← the output bits,
 *   4. virtual time += the scan period.
 * Nothing here reads a clock or a random source: the same inputs give the same run, scan for scan.
 */
import { formatAddress } from '../ladder/addresses';
import { fail, ok, type Result } from '../ladder/result';
import type { BlockState } from './blocks/behaviours';
import { generateKernels, type ScanKernel, type ScanKernels } from './codegen';
import { buildRungSolver, type FlowRecord, type RungSolver } from './interpreter';
import { createMemory, wordsOf, type Memory } from './memory';
import { resolveBit, resolveReader, type Reader } from './operandAccess';
import type { Plan } from './plan';
import { createFlowRecord, createPowerFlowView, type PowerFlowView } from './powerFlow';
import { applySnapshot, takeSnapshot, type RestoreReport, type RuntimeSnapshot } from './snapshot';

/** Which evaluator runs the rungs. */
export type EvaluatorKind = 'generated' | 'interpreter';

export interface RuntimeOptions {
  /** Scan period in ms, a whole number from 1 to 1000; 10 if absent. */
  scanMs?: number;
  /**
   * `auto` (default) uses generated code and falls back to the interpreter where the host forbids
   * code generation; the other two choose one (`generated` still falls back if it must).
   */
  evaluator?: 'auto' | EvaluatorKind;
  /**
   * Record power flow from the first scan. Without it recording starts at the first `powerFlow()`
   * call, whose view is then empty (`recorded: false`) until the next scan.
   */
  recordPowerFlow?: boolean;
}

export interface Runtime {
  readonly plan: Plan;
  /** Scan period, ms (1..1000). */
  readonly scanMs: number;
  /** Scans run so far. */
  readonly scanCount: number;
  /** Virtual time, ms: the scans run so far times the scan period. */
  readonly timeMs: number;
  /** Which evaluator this runtime uses. */
  readonly evaluator: EvaluatorKind;
  /** The field value of `%IX<index>` (1-based) for the next input scan. */
  setInput(index: number, value: boolean): void;
  /** Set every field input at once: `values[0]` is `%IX1`; missing entries leave their input as it was. */
  setInputs(values: ArrayLike<boolean>): void;
  /** `%QX<index>` (1-based) in the output image after the last scan, forces applied. */
  getOutput(index: number): boolean;
  /** Any address, tag or block member (`T1.ET` in ms, `C1.CV`); `undefined` if it names nothing here. */
  read(operand: string): boolean | number | undefined;
  /** Run one scan. */
  scan(): void;
  /** Run whole scans covering `ms`: ceil(ms / scanMs) of them. */
  run(ms: number): void;
  /** Force a bit (address or tag): an input force overrides the field, an output/memory force overrides coil writes. */
  force(operand: string, value: boolean): Result<void>;
  unforce(operand: string): void;
  clearForces(): void;
  /** The forces in effect, keyed by canonical address (`%IX1`). */
  forces(): ReadonlyMap<string, boolean>;
  /** Power flow of the last scan (see `RuntimeOptions.recordPowerFlow`). */
  powerFlow(): PowerFlowView;
  /** Plain, serialisable copy of the whole state. */
  snapshot(): RuntimeSnapshot;
  /**
   * Put a snapshot back. Parts that do not fit this plan (an instance that no longer exists or has
   * another type, a bit outside this panel) are skipped and listed in the report.
   */
  restore(snapshot: RuntimeSnapshot): RestoreReport;
}

/** The scan period limits, ms. */
export const SCAN_MS_MIN = 1;
export const SCAN_MS_MAX = 1000;
export const DEFAULT_SCAN_MS = 10;

/** Check a scan period someone typed. */
export function checkScanMs(value: number): Result<number> {
  if (!Number.isInteger(value) || value < SCAN_MS_MIN || value > SCAN_MS_MAX) {
    return fail(`the scan period must be a whole number of milliseconds from ${SCAN_MS_MIN} to ${SCAN_MS_MAX}, not ${String(value)}`);
  }
  return ok(value);
}

/** The mutable heart of a runtime, shared with the snapshot code. */
export interface RuntimeCore {
  readonly plan: Plan;
  readonly scanMs: number;
  readonly memory: Memory;
  /** Field value per input, 0/1, index 0 = %IX1. */
  readonly field: Uint8Array;
  /** Output image, 0/1, index 0 = %QX1. */
  readonly outputImage: Uint8Array;
  /** Forced bits: canonical address → bit index and value. */
  readonly forces: Map<string, { bit: number; value: boolean }>;
  scanCount: number;
  timeMs: number;
  /** Bumped on every restore, so power flow cached before it is dropped. */
  epoch: number;
}

/** Start a runtime on a plan: every bit FALSE, every block fresh, time 0. */
export function createRuntime(plan: Plan, options: RuntimeOptions = {}): Runtime {
  const scanMs = options.scanMs ?? DEFAULT_SCAN_MS;
  const checked = checkScanMs(scanMs);
  if (!checked.ok) throw new RangeError(checked.error);
  return new ScanRuntime(plan, scanMs, options);
}

/**
 * The runtime as a class, so that every instance shares one set of methods: a grading server runs
 * many runtimes side by side, and shared methods stay fast there.
 */
class ScanRuntime implements Runtime {
  readonly plan: Plan;
  readonly scanMs: number;
  readonly evaluator: EvaluatorKind;
  private readonly core: RuntimeCore;
  private readonly kernels: ScanKernels;
  /**
   * The state at the start of the last scan's rung solving. Power flow is replayed from it on
   * demand instead of being recorded on every scan; the copy is taken from the first
   * `powerFlow()` call on (or from the start with `recordPowerFlow`), so a runtime nobody watches
   * (grading, the command line) pays nothing for it.
   */
  private readonly before: Memory;
  private readonly bitWords: Int32Array;
  private readonly beforeBitWords: Int32Array;
  private readonly edgeWords: Int32Array;
  private readonly beforeEdgeWords: Int32Array;
  private recordFlow: boolean;
  private replayable = false;
  /** keep/forced change only through force calls; they are copied for the replay only then. */
  private forcesChanged = true;
  private flowCache: { scanCount: number; epoch: number; view: PowerFlowView } | null = null;
  private readonly readers = new Map<string, Reader | null>();
  /** Built at the first replay: a recording solver over its own scratch memory. */
  private replayer: Replayer | null = null;

  constructor(plan: Plan, scanMs: number, options: RuntimeOptions) {
    this.plan = plan;
    this.scanMs = scanMs;
    this.core = {
      plan,
      scanMs,
      memory: createMemory(plan),
      field: new Uint8Array(plan.space.inputs),
      outputImage: new Uint8Array(plan.space.outputs),
      forces: new Map(),
      scanCount: 0,
      timeMs: 0,
      epoch: 0,
    };
    const chosen = chooseKernels(plan, this.core.memory, options.evaluator ?? 'auto');
    this.kernels = chosen.kernels;
    this.evaluator = chosen.kind;
    this.before = createMemory(plan);
    this.bitWords = wordsOf(this.core.memory.bits);
    this.beforeBitWords = wordsOf(this.before.bits);
    this.edgeWords = wordsOf(this.core.memory.edges);
    this.beforeEdgeWords = wordsOf(this.before.edges);
    this.recordFlow = options.recordPowerFlow === true;
  }

  get scanCount(): number {
    return this.core.scanCount;
  }

  get timeMs(): number {
    return this.core.timeMs;
  }

  setInput(index: number, value: boolean): void {
    const field = this.core.field;
    if (!(index >= 1 && index <= field.length && Number.isInteger(index))) checkIndex(index, field.length, 'setInput', '%IX');
    field[index - 1] = value ? 1 : 0;
  }

  setInputs(values: ArrayLike<boolean>): void {
    const field = this.core.field;
    const n = values.length < field.length ? values.length : field.length;
    for (let i = 0; i < n; i += 1) field[i] = values[i] ? 1 : 0;
  }

  getOutput(index: number): boolean {
    const image = this.core.outputImage;
    if (!(index >= 1 && index <= image.length && Number.isInteger(index))) checkIndex(index, image.length, 'getOutput', '%QX');
    return image[index - 1] === 1;
  }

  read(operand: string): boolean | number | undefined {
    let reader = this.readers.get(operand);
    if (reader === undefined) {
      if (this.readers.size > 1000) this.readers.clear();
      reader = resolveReader(this.plan, operand);
      this.readers.set(operand, reader);
    }
    return reader === null ? undefined : reader(this.core.memory);
  }

  scan(): void {
    const core = this.core;
    const { bits, keep, forced, states } = core.memory;
    const field = core.field;
    const layout = this.plan.layout;
    const anyForces = core.forces.size !== 0;
    if (anyForces) {
      for (let i = 0; i < field.length; i += 1) {
        const bit = layout.inputs + i;
        bits[bit] = (field[i]! & keep[bit]!) | forced[bit]!;
      }
    } else {
      for (let i = 0; i < field.length; i += 1) bits[layout.inputs + i] = field[i]!;
    }
    if (this.recordFlow) this.keepForReplay(states, keep, forced);
    this.replayable = this.recordFlow;
    if (anyForces) this.kernels.forced(this.scanMs);
    else this.kernels.unforced(this.scanMs);
    const image = core.outputImage;
    for (let i = 0; i < image.length; i += 1) image[i] = bits[layout.outputs + i]!;
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
    this.core.forces.set(formatAddress(bit.value.address), { bit: bit.value.bit, value });
    this.forceBit(bit.value.bit, value);
    return ok(undefined);
  }

  unforce(operand: string): void {
    const bit = resolveBit(this.plan, operand);
    if (!bit.ok) return;
    const key = formatAddress(bit.value.address);
    if (!this.core.forces.has(key)) return;
    this.core.forces.delete(key);
    this.releaseBit(bit.value.bit);
  }

  clearForces(): void {
    for (const { bit } of this.core.forces.values()) this.releaseBit(bit);
    this.core.forces.clear();
  }

  forces(): ReadonlyMap<string, boolean> {
    return new Map([...this.core.forces].map(([key, { value }]) => [key, value]));
  }

  powerFlow(): PowerFlowView {
    const core = this.core;
    this.recordFlow = true;
    const cached = this.flowCache;
    if (cached !== null && cached.scanCount === core.scanCount && cached.epoch === core.epoch) return cached.view;
    const record = createFlowRecord(this.plan);
    if (this.replayable) {
      this.replayer ??= createReplayer(this.plan);
      copyMemory(this.before, this.replayer.memory);
      this.replayer.solve(this.scanMs);
      record.left.set(this.replayer.flow.left);
      record.right.set(this.replayer.flow.right);
    }
    const view = createPowerFlowView(this.plan, record, core.scanCount, this.replayable);
    this.flowCache = { scanCount: core.scanCount, epoch: core.epoch, view };
    return view;
  }

  snapshot(): RuntimeSnapshot {
    return takeSnapshot(this.core);
  }

  restore(snapshot: RuntimeSnapshot): RestoreReport {
    const report = applySnapshot(this.core, snapshot, (bit, value) => this.forceBit(bit, value));
    this.core.epoch += 1;
    this.replayable = false;
    this.forcesChanged = true;
    this.readers.clear();
    return report;
  }

  private keepForReplay(states: readonly BlockState[], keep: Uint8Array, forced: Uint8Array): void {
    const { bitWords, beforeBitWords, edgeWords, beforeEdgeWords, before } = this;
    for (let i = 0; i < bitWords.length; i += 1) beforeBitWords[i] = bitWords[i]!;
    for (let i = 0; i < edgeWords.length; i += 1) beforeEdgeWords[i] = edgeWords[i]!;
    const beforeStates = before.states;
    for (let i = 0; i < states.length; i += 1) beforeStates[i] = states[i]!;
    if (this.forcesChanged) {
      before.keep.set(keep);
      before.forced.set(forced);
      this.forcesChanged = false;
    }
  }

  private forceBit(bit: number, value: boolean): void {
    const { bits, keep, forced } = this.core.memory;
    const layout = this.plan.layout;
    this.forcesChanged = true;
    const v = value ? 1 : 0;
    keep[bit] = 0;
    forced[bit] = v;
    bits[bit] = v;
    if (bit >= layout.outputs && bit < layout.memory) this.core.outputImage[bit - layout.outputs] = v;
  }

  private releaseBit(bit: number): void {
    this.forcesChanged = true;
    this.core.memory.keep[bit] = 1;
    this.core.memory.forced[bit] = 0;
  }
}

function chooseKernels(plan: Plan, memory: Memory, choice: 'auto' | EvaluatorKind): { kernels: ScanKernels; kind: EvaluatorKind } {
  // The interpreter always applies the force masks; with nothing forced they change nothing.
  const interpreter: ScanKernel = buildRungSolver(plan, memory);
  const interpreted = { kernels: { forced: interpreter, unforced: interpreter }, kind: 'interpreter' as const };
  if (choice === 'interpreter') return interpreted;
  try {
    return { kernels: generateKernels(plan, memory), kind: 'generated' };
  } catch {
    // A Content Security Policy without 'unsafe-eval' makes `new Function` throw: same results, slower.
    return interpreted;
  }
}

/** A solver that records power flow, over scratch memory a replay copies the saved state into. */
interface Replayer {
  readonly memory: Memory;
  readonly flow: FlowRecord;
  readonly solve: RungSolver;
}

function createReplayer(plan: Plan): Replayer {
  const memory = createMemory(plan);
  const flow = createFlowRecord(plan);
  return { memory, flow, solve: buildRungSolver(plan, memory, flow) };
}

/** Copy memory; block states are immutable, so copying references is enough. */
function copyMemory(from: Memory, to: Memory): void {
  to.bits.set(from.bits);
  to.edges.set(from.edges);
  to.keep.set(from.keep);
  to.forced.set(from.forced);
  const states: BlockState[] = to.states;
  for (let i = 0; i < from.states.length; i += 1) states[i] = from.states[i]!;
}

function checkIndex(index: number, size: number, what: string, prefix: string): void {
  if (!Number.isInteger(index) || index < 1 || index > size) {
    throw new RangeError(`${what}: ${prefix}${String(index)} does not exist; this panel has ${prefix}1..${prefix}${size}`);
  }
}
