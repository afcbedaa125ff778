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
import { generateKernel, type ScanKernel } from './codegen';
import { solveRungs } from './interpreter';
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
  const { kernel, kind } = chooseKernel(plan, options.evaluator ?? 'auto');
  const core: RuntimeCore = {
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
  const { layout } = plan;
  // The state at the start of the last scan's rung solving, kept so the power flow can be replayed
  // on demand instead of being recorded on every scan.
  const before = createMemory(plan);
  const bitWords = wordsOf(core.memory.bits);
  const beforeBitWords = wordsOf(before.bits);
  const edgeWords = wordsOf(core.memory.edges);
  const beforeEdgeWords = wordsOf(before.edges);
  const states = core.memory.states;
  const beforeStates = before.states;
  // Power flow is replayed from a copy of memory taken before the rungs are solved; the copy is
  // taken from the first `powerFlow()` call on (or from the start with `recordPowerFlow`), so a
  // runtime that nobody watches (grading, the command line) pays nothing for it.
  let recordFlow = options.recordPowerFlow === true;
  let replayable = false;
  // keep/forced change only through force calls; they are copied for the replay only then.
  let forcesChanged = true;
  let flowCache: { scanCount: number; epoch: number; view: PowerFlowView } | null = null;
  const readers = new Map<string, Reader | null>();

  const forceBit = (bit: number, value: boolean): void => {
    const { bits, keep, forced } = core.memory;
    forcesChanged = true;
    const v = value ? 1 : 0;
    keep[bit] = 0;
    forced[bit] = v;
    bits[bit] = v;
    if (bit >= layout.outputs && bit < layout.memory) core.outputImage[bit - layout.outputs] = v;
  };

  const releaseBit = (bit: number): void => {
    forcesChanged = true;
    core.memory.keep[bit] = 1;
    core.memory.forced[bit] = 0;
  };

  const scan = (): void => {
    const { bits, keep, forced } = core.memory;
    for (let i = 0; i < core.field.length; i += 1) {
      const bit = layout.inputs + i;
      bits[bit] = (core.field[i]! & keep[bit]!) | forced[bit]!;
    }
    if (recordFlow) {
      for (let i = 0; i < bitWords.length; i += 1) beforeBitWords[i] = bitWords[i]!;
      for (let i = 0; i < edgeWords.length; i += 1) beforeEdgeWords[i] = edgeWords[i]!;
      for (let i = 0; i < states.length; i += 1) beforeStates[i] = states[i]!;
      if (forcesChanged) {
        before.keep.set(keep);
        before.forced.set(forced);
        forcesChanged = false;
      }
    }
    replayable = recordFlow;
    kernel(core.memory, scanMs);
    const image = core.outputImage;
    for (let i = 0; i < image.length; i += 1) image[i] = bits[layout.outputs + i]!;
    core.scanCount += 1;
    core.timeMs += scanMs;
  };

  const runtime: Runtime = {
    plan,
    scanMs,
    evaluator: kind,
    get scanCount() {
      return core.scanCount;
    },
    get timeMs() {
      return core.timeMs;
    },
    setInput(index, value) {
      if (!(index >= 1 && index <= core.field.length && Number.isInteger(index))) checkIndex(index, plan.space.inputs, 'setInput', '%IX');
      core.field[index - 1] = value ? 1 : 0;
    },
    setInputs(values) {
      const n = Math.min(values.length, core.field.length);
      for (let i = 0; i < n; i += 1) core.field[i] = values[i] ? 1 : 0;
    },
    getOutput(index) {
      checkIndex(index, plan.space.outputs, 'getOutput', '%QX');
      return core.outputImage[index - 1] === 1;
    },
    read(operand) {
      let reader = readers.get(operand);
      if (reader === undefined) {
        if (readers.size > 1000) readers.clear();
        reader = resolveReader(plan, operand);
        readers.set(operand, reader);
      }
      return reader === null ? undefined : reader(core.memory);
    },
    scan,
    run(ms) {
      if (!Number.isFinite(ms) || ms < 0) throw new RangeError(`run: the time must be a number of ms ≥ 0, not ${String(ms)}`);
      const scans = Math.ceil(ms / scanMs);
      for (let i = 0; i < scans; i += 1) scan();
    },
    force(operand, value) {
      const bit = resolveBit(plan, operand);
      if (!bit.ok) return bit;
      core.forces.set(formatAddress(bit.value.address), { bit: bit.value.bit, value });
      forceBit(bit.value.bit, value);
      return ok(undefined);
    },
    unforce(operand) {
      const bit = resolveBit(plan, operand);
      if (!bit.ok) return;
      const key = formatAddress(bit.value.address);
      if (!core.forces.has(key)) return;
      core.forces.delete(key);
      releaseBit(bit.value.bit);
    },
    clearForces() {
      for (const { bit } of core.forces.values()) releaseBit(bit);
      core.forces.clear();
    },
    forces() {
      return new Map([...core.forces].map(([key, { value }]) => [key, value]));
    },
    powerFlow() {
      recordFlow = true;
      if (flowCache !== null && flowCache.scanCount === core.scanCount && flowCache.epoch === core.epoch) {
        return flowCache.view;
      }
      const record = createFlowRecord(plan);
      if (replayable) {
        const replay = createMemory(plan);
        copyMemory(before, replay);
        solveRungs(plan, replay, scanMs, record);
      }
      const view = createPowerFlowView(plan, record, core.scanCount, replayable);
      flowCache = { scanCount: core.scanCount, epoch: core.epoch, view };
      return view;
    },
    snapshot: () => takeSnapshot(core),
    restore(snapshot) {
      const report = applySnapshot(core, snapshot, forceBit);
      core.epoch += 1;
      replayable = false;
      forcesChanged = true;
      readers.clear();
      return report;
    },
  };
  return runtime;
}

function chooseKernel(plan: Plan, choice: 'auto' | EvaluatorKind): { kernel: ScanKernel; kind: EvaluatorKind } {
  const interpreter: ScanKernel = (memory, dtMs) => solveRungs(plan, memory, dtMs);
  if (choice === 'interpreter') return { kernel: interpreter, kind: 'interpreter' };
  try {
    return { kernel: generateKernel(plan), kind: 'generated' };
  } catch {
    // A Content Security Policy without 'unsafe-eval' makes `new Function` throw: same results, slower.
    return { kernel: interpreter, kind: 'interpreter' };
  }
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
