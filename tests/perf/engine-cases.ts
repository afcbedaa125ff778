/**
 * The engine benchmark's cases, prepared the same way in Node and in the page benchmark: the
 * program compiled and started on the engine, the baseline started on its typed arrays, both
 * wrapped as `Subject`s that report their whole memory for the agreement check.
 */
import { compile, createRuntime, type Plan, type Runtime, type RuntimeSnapshot } from '@shared/engine';
import { lowerProgram } from '@shared/engine/lower';
import { checkDocumentBounds } from '@shared/ladder/bounds';
import type { AddressSpace } from '@shared/ladder/addresses';
import type { BlockType, NetworkNode, Program } from '@shared/ladder/schema';
import { createDemoState, demoCases, type DemoCase, type DemoState } from './engine-demo';
import { inputPatterns, type MemoryImage, type Subject } from './engine-measure';
import { BENCH_SPACE, benchProgram, type BaselineBlock, type ProgramShape } from './engine-programs';

export const SCAN_MS = 10;
/**
 * Generated program sizes, rungs. The 10,000-rung cases tell whether the engine would hold a higher
 * rung limit (issue 18); the schema's limit is 5,000 rungs and a document is also held to 20,000
 * nodes (`DOCUMENT_LIMITS`), so the 5,000- and 10,000-rung cases (~60,000 and ~120,000 nodes) are
 * lowered directly (see `planFor`).
 */
export const GENERATED_SIZES = [10, 100, 1000, 5000, 10000] as const;

/** Whether a case's program is within the document size limits (decided before any timing). */
export function withinDocumentLimits(program: Program): boolean {
  return checkDocumentBounds(program) === null;
}

/**
 * The case's plan through `compile`, or, for a program past the document size limits (the 5,000-
 * rung cases, ~60,000 nodes), lowered directly: no one can save such a document, but the bench
 * measures how the engine scales with the plan's size. `within` is `withinDocumentLimits`, worked
 * out beforehand so that its walk is not counted as compiling.
 */
export function planFor(program: Program, space: AddressSpace, within: boolean): Plan {
  if (within) {
    const compiled = compile(program, { space });
    if (!compiled.ok) throw new Error(`the case does not compile: ${compiled.diagnostics[0]?.message}`);
    return compiled.plan;
  }
  const lowered = lowerProgram(program, space);
  if (!lowered.ok) throw new Error(`the case does not lower: ${lowered.diagnostics[0]?.message}`);
  return lowered.plan;
}
export const SHAPES: readonly ProgramShape[] = ['series', 'parallel'];

export interface CaseSpec {
  /** `demo conveyor`, `series 1000`… */
  id: string;
  demo?: string;
  shape?: ProgramShape;
  rungs: number;
}

export function caseSpecs(sizes: readonly number[] = GENERATED_SIZES): CaseSpec[] {
  const demos = demoCases().map((d): CaseSpec => ({ id: `demo ${d.name}`, demo: d.name, rungs: d.program.rungs.length }));
  const generated = sizes.flatMap((rungs) => SHAPES.map((shape): CaseSpec => ({ id: `${shape} ${rungs}`, shape, rungs })));
  return [...demos, ...generated];
}

export type Measured = Subject & { image(): MemoryImage };

/** What a generated baseline module exports (see engine-programs.ts). */
export interface BaselineModule {
  createBaselineState(): GeneratedState;
  baselineScan(s: GeneratedState, field: readonly boolean[], dt: number): void;
}

interface GeneratedState {
  I: Uint8Array;
  Q: Uint8Array;
  M: Uint8Array;
  E: Uint8Array;
  BQ: Uint8Array;
  BD: Uint8Array;
  BL: Uint8Array;
  BM: Uint8Array;
  BN: Int32Array;
  outputImage: Uint8Array;
}

export interface PreparedCase {
  spec: CaseSpec;
  engine: Measured;
  baseline: Measured;
  runtime: Runtime;
  elements: number;
  /** `compile()`, `createRuntime()` and the first scan, ms (the first scan compiles the code it runs). */
  compileMs: number;
  runtimeMs: number;
  firstScanMs: number;
}

function snapshotImage(snapshot: RuntimeSnapshot): MemoryImage {
  return {
    inputs: snapshot.bits.inputs,
    outputs: snapshot.bits.outputs,
    memory: snapshot.bits.memory,
    edges: snapshot.edges.map((e) => e.value),
    outputImage: snapshot.outputImage,
    instances: new Map(snapshot.instances.map((i) => [i.name, i.state as unknown as Record<string, boolean | number>])),
  };
}

function engineSubject(runtime: Runtime, patterns: readonly boolean[][]): Measured {
  const count = patterns.length;
  return {
    run(from, n) {
      for (let k = 0; k < n; k += 1) {
        runtime.setInputs(patterns[(from + k) % count]!);
        runtime.scan();
      }
    },
    image: () => snapshotImage(runtime.snapshot()),
  };
}

const BLOCK_FIELDS = {
  TON: (s, k) => ({ Q: s.BQ[k] === 1, ET: s.BN[k]! }),
  TOF: (s, k) => ({ Q: s.BQ[k] === 1, ET: s.BN[k]! }),
  TP: (s, k) => ({ Q: s.BQ[k] === 1, ET: s.BN[k]!, lastIN: s.BL[k] === 1 }),
  CTU: (s, k) => ({ Q: s.BQ[k] === 1, CV: s.BN[k]!, lastCU: s.BL[k] === 1 }),
  CTD: (s, k) => ({ Q: s.BQ[k] === 1, CV: s.BN[k]!, lastCD: s.BL[k] === 1 }),
  CTUD: (s, k) => ({ QU: s.BQ[k] === 1, QD: s.BD[k] === 1, CV: s.BN[k]!, lastCU: s.BL[k] === 1, lastCD: s.BM[k] === 1 }),
} satisfies Partial<Record<BlockType, (s: GeneratedState, k: number) => Record<string, boolean | number>>>;

function generatedBaseline(module: BaselineModule, blocks: readonly BaselineBlock[], patterns: readonly boolean[][]): Measured {
  const state = module.createBaselineState();
  const scan = module.baselineScan;
  const count = patterns.length;
  return {
    run(from, n) {
      for (let k = 0; k < n; k += 1) scan(state, patterns[(from + k) % count]!, SCAN_MS);
    },
    image: () => ({
      inputs: state.I,
      outputs: state.Q,
      memory: state.M,
      edges: state.E.subarray(0, state.E.length),
      outputImage: state.outputImage,
      instances: new Map(blocks.map((b) => [b.name, BLOCK_FIELDS[b.type as keyof typeof BLOCK_FIELDS](state, b.k)])),
    }),
  };
}

function demoBaseline(demo: DemoCase, patterns: readonly boolean[][]): Measured {
  const state: DemoState = createDemoState(demo);
  const count = patterns.length;
  return {
    run(from, n) {
      for (let k = 0; k < n; k += 1) demo.scan(state, patterns[(from + k) % count]!, SCAN_MS);
    },
    image: () => ({
      inputs: state.I,
      outputs: state.Q,
      memory: state.M,
      edges: state.E.subarray(0, demo.edges),
      outputImage: state.outputImage,
      instances: new Map(demo.blocks.map((b) => [b.name, b.state(state)])),
    }),
  };
}

/** The program a spec benchmarks, with its generated baseline's description. */
type CaseProgram = { program: Program; space: AddressSpace; demo?: DemoCase; generated?: ReturnType<typeof benchProgram> };

/** Programs generated so far, by case id: generating one is deterministic, and its garbage would fall into the compile figures. */
const casePrograms = new Map<string, CaseProgram>();

export function caseProgram(spec: CaseSpec): CaseProgram {
  let found = casePrograms.get(spec.id);
  if (found === undefined) casePrograms.set(spec.id, (found = makeCaseProgram(spec)));
  return found;
}

function makeCaseProgram(spec: CaseSpec): CaseProgram {
  if (spec.demo !== undefined) {
    const demo = demoCases().find((d) => d.name === spec.demo)!;
    return { program: demo.program, space: demo.space, demo };
  }
  const generated = benchProgram(spec.shape!, spec.rungs);
  return { program: generated.program, space: BENCH_SPACE, generated };
}

/**
 * `node` with its first contact (depth first) examining `operand` instead, copied along the path
 * to it and sharing everything else, as a pure edit does; null when it holds no contact.
 */
function withFirstContact(node: NetworkNode, operand: (old: string) => string): NetworkNode | null {
  if (node.kind === 'contact') return { ...node, operand: operand(node.operand) };
  if (node.kind !== 'series' && node.kind !== 'parallel') return null;
  const children = node.kind === 'series' ? node.items : node.branches;
  for (let i = 0; i < children.length; i += 1) {
    const changed = withFirstContact(children[i]!, operand);
    if (changed === null) continue;
    const copy = children.slice();
    copy[i] = changed;
    return node.kind === 'series' ? { ...node, items: copy } : { ...node, branches: copy };
  }
  return null;
}

/**
 * The case's document after edit number `n`, as the workbench recompiles a running program: a new
 * document whose rung `n` (modulo the rung count) has its first contact examine another input, made
 * the way the editor's pure edits make one (the path to the change copied, every other rung and node
 * shared). No cache kept for the original document, its plan or its module applies to it: those
 * are kept per document and per plan, and the module's bytes differ. Made before any timing.
 */
export function editedProgram(spec: CaseSpec, n: number): { program: Program; space: AddressSpace; within: boolean } {
  const { program, space } = caseProgram(spec);
  const rungs = program.rungs.slice();
  const input = `%IX${(n % space.inputs) + 1}`;
  const other = `%IX${((n + 1) % space.inputs) + 1}`;
  for (let k = 0; k < rungs.length; k += 1) {
    const at = (n + k) % rungs.length;
    const network = withFirstContact(rungs[at]!.network, (old) => (old === input ? other : input));
    if (network === null) continue;
    rungs[at] = { ...rungs[at]!, network: network as Program['rungs'][number]['network'] };
    break;
  }
  const copy: Program = { ...program, rungs };
  return { program: copy, space, within: withinDocumentLimits(copy) };
}

/** Compile an edited document to a first scan (see `editedProgram`): ms of `nowMs`. */
export function compileEdited(edited: ReturnType<typeof editedProgram>, nowMs: () => number): number {
  const t0 = nowMs();
  const plan = planFor(edited.program, edited.space, edited.within);
  createRuntime(plan, { scanMs: SCAN_MS }).scan();
  return nowMs() - t0;
}

/** Edits compiled per case for the "after an edit" figure: fewer for the largest programs. */
export const editCount = (rungs: number): number => (rungs >= 5000 ? 5 : 9);

/** Scans the agreement check compares memory after: fewer for the largest programs. */
export const agreementScans = (rungs: number): number => (rungs >= 5000 ? 200 : 1000);

/**
 * Compile and start a case on both sides. `module` is the generated baseline's module (generated
 * cases); `nowMs` a millisecond clock for the compile figures.
 */
export function prepareCase(spec: CaseSpec, module: BaselineModule | null, nowMs: () => number): PreparedCase {
  const { program, space, demo, generated } = caseProgram(spec);
  const patterns = inputPatterns(space.inputs, 1009, 11);
  const within = withinDocumentLimits(program);
  const t0 = nowMs();
  const plan = planFor(program, space, within);
  const t1 = nowMs();
  const runtime = createRuntime(plan, { scanMs: SCAN_MS });
  const t2 = nowMs();
  // The first scan runs on a copy, so the measured runtime starts from scan 0 like the baseline.
  const first = createRuntime(plan, { scanMs: SCAN_MS });
  const t3 = nowMs();
  first.scan();
  const t4 = nowMs();
  let baseline: Measured;
  if (demo !== undefined) baseline = demoBaseline(demo, patterns);
  else if (module !== null && generated !== undefined) baseline = generatedBaseline(module, generated.blocks, patterns);
  else throw new Error(`${spec.id}: its baseline module is missing`);
  return {
    spec,
    engine: engineSubject(runtime, patterns),
    baseline,
    runtime,
    elements: plan.elementCount,
    compileMs: t1 - t0,
    runtimeMs: t2 - t1,
    firstScanMs: t4 - t3,
  };
}
