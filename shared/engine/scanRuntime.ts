/**
 * `ScanRuntime`, the class behind `createRuntime` (see runtime.ts for the scan cycle). A class, so
 * that every instance shares one set of methods: a grading server runs many runtimes side by side,
 * and shared methods stay fast there.
 */
import { formatAddress } from '../ladder/addresses';
import { ok, type Result } from '../ladder/result';
import type { BlockState } from './blocks/behaviours';
import { generateKernels, type ScanKernel, type ScanKernels } from './codegen';
import { buildRungSolver, type FlowRecord, type RungSolver } from './interpreter';
import { createMemory, wordsOf, type Memory } from './memory';
import { resolveBit, resolveReader, type Reader } from './operandAccess';
import type { Plan } from './plan';
import { createFlowRecord, createPowerFlowView, type PowerFlowView } from './powerFlow';
import type { EvaluatorKind, Runtime, RuntimeCore, RuntimeOptions } from './runtime';
import { applySnapshot, takeSnapshot, type RestoreReport, type RuntimeSnapshot } from './snapshot';

export class ScanRuntime implements Runtime {
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
