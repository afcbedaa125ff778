/**
 * Generated kernels: the plan written out as straight-line JavaScript, several times faster than
 * walking it. Safety rule: the source text is assembled only from the fixed templates below and
 * from numbers taken from the validated plan (bit, edge and instance indices, constants checked to
 * be finite) and formal member names checked against `BLOCK_SPECS`. No text a user typed (operands,
 * tags, ids, comments) is ever written into it.
 *
 * Large programs are split into chunks, one function each, because a very long function is never
 * optimised by the JavaScript engine.
 */
import { BLOCK_SPECS, BLOCK_TYPES } from '../ladder/blocks';
import type { CoilVariant, ContactVariant } from '../ladder/schema';
import { BLOCK_BEHAVIOURS } from './blocks/behaviours';
import type { Memory } from './memory';
import type { Plan, PlanNode, PlanOp, PlanRung, PlanSource } from './plan';

/** Solves the rungs of one scan over the memory it was built for; same contract as the interpreter's `buildRungSolver`. */
export type ScanKernel = (dtMs: number) => void;

type RawKernel = (
  bits: Uint8Array,
  edges: Uint8Array,
  states: unknown[],
  keep: Uint8Array,
  forced: Uint8Array,
  dtMs: number,
) => void;

/** Elements per generated function: small enough that each one gets optimised. */
const CHUNK_ELEMENTS = 240;

const CONTACT_CODE = {
  no: (v: string) => v,
  nc: (v: string) => `(${v} ^ 1)`,
  rising: (v: string, last: string) => `(${v} & (${last} ^ 1))`,
  falling: (v: string, last: string) => `((${v} ^ 1) & ${last})`,
} as const satisfies Record<ContactVariant, (v: string, last: string) => string>;

const COIL_CODE = {
  coil: (p: string) => p,
  negated: (p: string) => `(${p} ^ 1)`,
  set: (p: string, old: string) => `(${p} | ${old})`,
  reset: (p: string, old: string) => `(${old} & (${p} ^ 1))`,
} as const satisfies Record<CoilVariant, (p: string, old: string) => string>;

function index(n: number): string {
  if (!Number.isSafeInteger(n) || n < 0) throw new Error(`code generation: bad index ${String(n)}`);
  return String(n);
}

function constant(n: number): string {
  if (!Number.isFinite(n)) throw new Error(`code generation: bad constant ${String(n)}`);
  return String(n);
}

/** Every formal parameter name of the standard blocks: the only identifiers taken from outside the templates. */
const FORMAL_NAMES: ReadonlySet<string> = new Set(
  BLOCK_TYPES.flatMap((type) => [...BLOCK_SPECS[type].inputs, ...BLOCK_SPECS[type].outputs].map((p) => p.name)),
);

function member(name: string): string {
  if (!FORMAL_NAMES.has(name) || !/^[A-Z][A-Z0-9]*$/.test(name)) throw new Error(`code generation: bad member ${name}`);
  return name;
}

/** The value of a source as a number (BOOL as 0/1). */
function numberCode(source: PlanSource): string {
  switch (source.kind) {
    case 'bit':
      return `b[${index(source.bit)}]`;
    case 'member':
      return source.type === 'BOOL'
        ? `(s[${index(source.instance)}].${member(source.member)} ? 1 : 0)`
        : `s[${index(source.instance)}].${member(source.member)}`;
    case 'constant':
      return constant(source.value);
  }
}

/** The value of a source as a boolean. */
function booleanCode(source: PlanSource): string {
  switch (source.kind) {
    case 'bit':
      return `(b[${index(source.bit)}] === 1)`;
    case 'member':
      return source.type === 'BOOL'
        ? `s[${index(source.instance)}].${member(source.member)}`
        : `(s[${index(source.instance)}].${member(source.member)} !== 0)`;
    case 'constant':
      return source.value !== 0 ? 'true' : 'false';
  }
}

interface Emitting {
  /** With force masks on every coil write; without, for scans while nothing is forced. */
  readonly forces: boolean;
  readonly lines: string[];
  /** Declarations of the reusable input records, one per block call (see the block emitter). */
  readonly records: string[];
  maxDepth: number;
}

type Emitter<N extends PlanNode> = (node: N, depth: number, out: Emitting) => void;

/** Each emitter leaves the node's right-hand power in `r<depth>`, given its left power there. */
const EMITTERS = {
  series: (node, depth, out) => {
    for (const item of node.items) emit(item, depth, out);
  },
  parallel: (node, depth, out) => {
    const inner = depth + 1;
    out.maxDepth = Math.max(out.maxDepth, inner);
    out.lines.push(`l${depth} = r${depth}; o${depth} = 0;`);
    for (const branch of node.branches) {
      out.lines.push(`r${inner} = l${depth};`);
      emit(branch, inner, out);
      out.lines.push(`o${depth} |= r${inner};`);
    }
    out.lines.push(`r${depth} = o${depth};`);
  },
  contact: (node, depth, out) => {
    if (node.edge < 0) {
      out.lines.push(`r${depth} &= ${CONTACT_CODE[node.variant](numberCode(node.source), '0')};`);
      return;
    }
    const last = `e[${index(node.edge)}]`;
    out.lines.push(`t = ${numberCode(node.source)}; r${depth} &= ${CONTACT_CODE[node.variant]('t', last)}; ${last} = t;`);
  },
  coil: (node, depth, out) => {
    const n = index(node.bit);
    const value = COIL_CODE[node.variant](`r${depth}`, `b[${n}]`);
    out.lines.push(out.forces ? `b[${n}] = (${value} & k[${n}]) | f[${n}];` : `b[${n}] = ${value};`);
  },
  block: (node, depth, out) => {
    const typeIndex = BLOCK_TYPES.indexOf(node.type);
    if (typeIndex < 0) throw new Error('code generation: unknown block type');
    const i = index(node.instance);
    // One input record per call site, made once and refilled on every scan: a step only reads its
    // inputs during the call, so reusing the record saves an allocation per block per scan.
    const record = `in${out.records.length}`;
    const names = [member(node.powerIn), ...node.inputs.map((input) => member(input.name))];
    // Constant inputs (a preset such as T#3s) are written once, into the record's initial value.
    const code = (input: (typeof node.inputs)[number]): string =>
      input.type === 'BOOL' ? booleanCode(input.source) : numberCode(input.source);
    const isConstant = (input: (typeof node.inputs)[number]): boolean => input.source.kind === 'constant';
    const initialValues = [
      `${names[0]}: false`,
      ...node.inputs.map((input, n) => `${names[n + 1]}: ${isConstant(input) ? code(input) : input.type === 'BOOL' ? 'false' : '0'}`),
    ];
    out.records.push(`const ${record} = { ${initialValues.join(', ')} };`);
    const fills = [`${record}.${names[0]} = r${depth} === 1;`];
    node.inputs.forEach((input, n) => {
      if (!isConstant(input)) fills.push(`${record}.${names[n + 1]} = ${code(input)};`);
    });
    const dt = node.chargesTime ? 'dt' : '0';
    out.lines.push(`${fills.join(' ')} s[${i}] = step${typeIndex}(s[${i}], ${record}, ${dt});`);
    out.lines.push(`r${depth} = s[${i}].${member(node.powerOut)} ? 1 : 0;`);
  },
} as const satisfies { [K in PlanOp]: Emitter<Extract<PlanNode, { op: K }>> };

function emit(node: PlanNode, depth: number, out: Emitting): void {
  (EMITTERS[node.op] as Emitter<PlanNode>)(node, depth, out);
}

function countElements(node: PlanNode): number {
  if (node.op === 'series') return node.items.reduce((sum, item) => sum + countElements(item), 0);
  if (node.op === 'parallel') return node.branches.reduce((sum, branch) => sum + countElements(branch), 0);
  return 1;
}

function chunkRungs(rungs: readonly PlanRung[]): PlanRung[][] {
  const chunks: PlanRung[][] = [];
  let current: PlanRung[] = [];
  let size = 0;
  for (const rung of rungs) {
    const n = countElements(rung.network);
    if (current.length > 0 && size + n > CHUNK_ELEMENTS) {
      chunks.push(current);
      current = [];
      size = 0;
    }
    current.push(rung);
    size += n;
  }
  if (current.length > 0) chunks.push(current);
  return chunks;
}

function chunkSource(rungs: readonly PlanRung[], name: string, records: string[], forces: boolean): string {
  const out: Emitting = { forces, lines: [], records, maxDepth: 0 };
  for (const rung of rungs) {
    out.lines.push('r0 = 1;');
    emit(rung.network, 0, out);
  }
  const locals = ['t = 0'];
  for (let d = 0; d <= out.maxDepth; d += 1) locals.push(`r${d} = 0`, `l${d} = 0`, `o${d} = 0`);
  return [
    `function ${name}(b, e, s, k, f, dt) {`,
    `  let ${locals.join(', ')};`,
    ...out.lines.map((line) => `  ${line}`),
    '}',
  ].join('\n');
}

/**
 * The kernel's source: a factory body taking the step functions (in `BLOCK_TYPES` order) and
 * returning the kernel. `forces: false` leaves out the force masks, for scans while nothing is
 * forced. Exposed so tests can inspect what is generated.
 */
export function kernelSource(plan: Plan, options: { forces?: boolean } = {}): string {
  const forces = options.forces ?? true;
  const chunks = chunkRungs(plan.rungs);
  const header = BLOCK_TYPES.map((_, i) => `const step${i} = steps[${i}];`);
  const records: string[] = [];
  const bodies = chunks.map((rungs, i) => chunkSource(rungs, `chunk${i}`, records, forces));
  const calls = chunks.map((_, i) => `  chunk${i}(b, e, s, k, f, dt);`);
  // One chunk is the kernel itself: no call in between.
  const kernel = chunks.length === 1 ? ['return chunk0;'] : ['return function kernel(b, e, s, k, f, dt) {', ...calls, '};'];
  return ["'use strict';", ...header, ...records, ...bodies, ...kernel].join('\n');
}

/** The two kernels of a plan over one memory: for scans with forces in effect, and without. */
export interface ScanKernels {
  readonly forced: ScanKernel;
  readonly unforced: ScanKernel;
}

/**
 * Build the generated kernels over `memory`. Throws when the host forbids code generation (a
 * Content Security Policy without 'unsafe-eval' makes `new Function` throw an EvalError); the
 * runtime then uses the interpreter.
 */
export function generateKernels(plan: Plan, memory: Memory): ScanKernels {
  const { bits, edges, states, keep, forced } = memory;
  const build = (forces: boolean): ScanKernel => {
    const steps = BLOCK_TYPES.map((type) => BLOCK_BEHAVIOURS[type].step);
    const factory = new Function('steps', kernelSource(plan, { forces })) as (steps: unknown[]) => RawKernel;
    const raw = factory(steps);
    return (dtMs) => raw(bits, edges, states, keep, forced, dtMs);
  };
  return { forced: build(true), unforced: build(false) };
}
