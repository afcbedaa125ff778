/**
 * The scan kernel: a plan written out as a WebAssembly module over the runtime's memory (see
 * `stateLayout.ts`). Its one export, `scan(dt)`, runs a whole scan but the bookkeeping: input
 * image from the field (forces win), the rungs top to bottom (the output bits are the output
 * image).
 *
 * Safety rule: a module is assembled only from the fixed instructions in `wasm/opcodes.ts`, laid
 * down by the emitters of `elements.ts` and `blocks/`, with numbers taken from the validated plan
 * (byte addresses, constants checked to be finite). No text a user typed (operands, tags, ids,
 * comments) ever enters it, and it can touch nothing but its own memory.
 *
 * With `recordFlow`, every node also stores the power on its left and right into the flow record:
 * the variant a live view runs. Without it, nothing is recorded (grading, the command line). With
 * `forces`, every write into a bit goes through its force masks; without, it is a plain store,
 * right while nothing is forced (the machine picks the variant, see `machine.ts`).
 */
import { BLOCK_SPECS } from '../ladder/blocks';
import type { BlockEmit } from './blocks/blockEmit';
import { BLOCK_BEHAVIOURS } from './blocks/behaviours';
import { COIL_KINDS, COIL_VARIANTS, CONTACT_KINDS, CONTACT_VARIANTS, type CoilKind, type ContactKind } from './elements';
import { NODE_OP, NODE_STRIDE, type Plan, type PlanBlock, type PlanOp, type PlanSource } from './plan';
import type { StateLayout } from './stateLayout';
import { Code, DT } from './wasm/code';
import { assembleModule } from './wasm/module';
import { CELL, OP } from './wasm/opcodes';

/** Elements per generated function: each function is compiled and optimised on its own. */
const CHUNK_ELEMENTS = 400;

/** Scratch i32 locals by use (see `Code`): each use is short and never spans another's. */
const FLOW_TEMP = 0;
const COIL_POWER = 1;
const EDGE_VALUE = 2;
const FIELD_WORD = 3;
const FIELD_STALE = 4;
/** A block call's BOOL inputs, the power-flow input first (CTUD has the most: 4). */
const BLOCK_BOOLS = 4;
const BLOCK_SCRATCH_I32 = 8;
/** A block call's numeric input (PT or PV), then the emitter's scratch. */
const BLOCK_NUMBER = 0;
const BLOCK_SCRATCH_F64 = 2;

interface Emitting {
  readonly code: Code;
  readonly plan: Plan;
  /** The plan's node table (`PlanNodes.data`). */
  readonly nodes: Int32Array;
  /** The instructions of each contact without an edge memory met so far, by `contactKey` (shared by the module's functions). */
  readonly contacts: Array<Uint8Array | undefined>;
  readonly layout: StateLayout;
  readonly recordFlow: boolean;
  readonly forces: boolean;
}

export interface KernelOptions {
  /** Store the power on both sides of every node (a live view). */
  readonly recordFlow: boolean;
  /** Let forced bits keep their forced value (needed only while a bit is forced). */
  readonly forces: boolean;
}

function checkedAddress(n: number): number {
  if (!Number.isSafeInteger(n) || n < 0) throw new RangeError(`wasm: bad address ${String(n)}`);
  return n;
}

/** Byte address of bit `bit` of the image, and of its cell in an area of one cell per bit. */
const bitAt = (bit: number, area = 0): number => checkedAddress(area + CELL * bit);

/** Byte address of a field of an instance's record. */
function fieldAddress(e: Emitting, instance: number, name: string): number {
  const record = e.layout.recordLayouts[instance];
  const field = record?.byName.get(name);
  if (record === undefined || field === undefined) throw new RangeError(`wasm: no field ${name} in instance ${instance}`);
  return checkedAddress(e.layout.records[instance]! + field.offset);
}

/** Push a source as a BOOL (0/1). */
function pushBool(e: Emitting, source: PlanSource): void {
  switch (source.kind) {
    case 'bit':
      e.code.loadCell(bitAt(source.bit));
      return;
    case 'member':
      if (source.type !== 'BOOL') throw new TypeError('wasm: a BOOL is read from a BOOL member');
      e.code.loadCell(fieldAddress(e, source.instance, source.member));
      return;
    case 'constant':
      e.code.i32(source.value !== 0 ? 1 : 0);
  }
}

/** Push a TIME or INT source as an f64. */
function pushNumber(e: Emitting, source: PlanSource): void {
  switch (source.kind) {
    case 'bit':
      throw new TypeError('wasm: a number is never read from a bit');
    case 'member':
      if (source.type === 'BOOL') throw new TypeError('wasm: a number is read from a TIME or INT member');
      e.code.loadF64(fieldAddress(e, source.instance, source.member));
      return;
    case 'constant':
      e.code.f64(source.value);
  }
}

/**
 * Store into bit `bit` the value already on the stack above the address base, unless the bit is
 * forced: `(value & keep) | forced`.
 */
function endStoreBit(e: Emitting, bit: number): void {
  const { code, layout } = e;
  if (!e.forces) {
    code.endStoreCell(bitAt(bit));
    return;
  }
  code.loadCell(bitAt(bit, layout.keep));
  code.op(OP.i32And);
  code.loadCell(bitAt(bit, layout.forced));
  code.op(OP.i32Or);
  code.endStoreCell(bitAt(bit));
}

const CONTACTS: readonly ContactKind[] = CONTACT_VARIANTS.map((variant) => CONTACT_KINDS[variant]);
const COILS: readonly CoilKind[] = COIL_VARIANTS.map((variant) => COIL_KINDS[variant]);

/**
 * The emitters, one per kind of node (see `PlanNodes` for what `a`, `b` and `edge` are). Each
 * finds the power on its left on the stack and leaves the power on its right; a series or
 * parallel emits its children and returns the index of the node after them.
 */
function emitSeries(at: number, count: number, depth: number, e: Emitting): number {
  let next = at + 1;
  for (let k = 0; k < count; k += 1) next = emitNode(next, depth, e);
  return next;
}

function emitParallel(at: number, count: number, depth: number, e: Emitting): number {
  const { code } = e;
  if (count === 0) {
    code.op(OP.drop);
    code.i32(0);
    return at + 1;
  }
  const left = code.depthLocal(depth);
  code.set(left);
  let next = at + 1;
  for (let k = 0; k < count; k += 1) {
    code.get(left);
    next = emitNode(next, depth + 1, e);
    if (k > 0) code.op(OP.i32Or);
  }
  return next;
}

/**
 * A contact without an edge memory is the same instructions wherever it stands (its source and
 * its variant's), and a long program repeats a few hundred of them thousands of times: each is
 * emitted once and copied after that (compiling 1,000 rungs in a fresh process, the emitters'
 * calls per contact cost more than the rest of the kernel).
 */
const contactKey = (variant: number, source: number): number => source * CONTACTS.length + variant;

function emitContact(variant: number, source: number, edge: number, e: Emitting): void {
  const kind = CONTACTS[variant]!;
  const { code } = e;
  if (kind.edge) {
    pushBool(e, e.plan.sources[source]!);
    kind.emit({ code, edge: bitAt(edge, e.layout.edges), temp: code.i32Temp(EDGE_VALUE) });
    return;
  }
  const key = contactKey(variant, source);
  const known = e.contacts[key];
  if (known !== undefined) {
    code.out.appendCopy(known);
    return;
  }
  const start = code.out.length;
  pushBool(e, e.plan.sources[source]!);
  kind.emit({ code, edge: -1, temp: code.i32Temp(EDGE_VALUE) });
  e.contacts[key] = code.out.since(start);
}

function emitCoil(variant: number, bit: number, edgeIndex: number, e: Emitting): void {
  const { code } = e;
  const kind = COILS[variant]!;
  const power = code.i32Temp(COIL_POWER);
  const edge = kind.edge ? bitAt(edgeIndex, e.layout.edges) : -1;
  code.set(power);
  code.storeBase();
  kind.emit({ code, power, bit: bitAt(bit), edge });
  endStoreBit(e, bit);
  if (kind.edge) {
    code.storeBase();
    code.get(power);
    code.endStoreCell(edge);
  }
  code.get(power);
}

function emitBlock(node: PlanBlock, e: Emitting): void {
  const { code } = e;
  const bools = new Map<string, number>([[node.powerIn, code.i32Temp(BLOCK_BOOLS)]]);
  const numbers = new Map<string, number>();
  code.set(bools.get(node.powerIn)!);
  // Every input is read before the block changes anything (see BlockEmit).
  for (const input of node.inputs) {
    if (input.type === 'BOOL') {
      const local = code.i32Temp(BLOCK_BOOLS + bools.size);
      pushBool(e, input.source);
      code.set(local);
      bools.set(input.name, local);
    } else {
      const local = code.f64Temp(BLOCK_NUMBER + numbers.size);
      pushNumber(e, input.source);
      code.set(local);
      numbers.set(input.name, local);
    }
  }
  const local = (table: Map<string, number>, name: string): number => {
    const found = table.get(name);
    if (found === undefined) throw new RangeError(`wasm: ${node.type} has no input ${name}`);
    return found;
  };
  const context: BlockEmit = {
    code,
    field: (name) => fieldAddress(e, node.instance, name),
    bool: (name) => code.get(local(bools, name)),
    number: (name) => code.get(local(numbers, name)),
    dt: () => (node.chargesTime ? code.get(DT) : code.f64(0)),
    i32: (n) => code.i32Temp(BLOCK_SCRATCH_I32 + n),
    f64: (n) => code.f64Temp(BLOCK_SCRATCH_F64 + n),
  };
  BLOCK_BEHAVIOURS[node.type].emit(context);
  code.loadCell(fieldAddress(e, node.instance, BLOCK_SPECS[node.type].powerOut));
}

/** Store the power on the stack into a flow record byte, leaving it on the stack. */
function recordFlow(e: Emitting, address: number): void {
  const { code } = e;
  const temp = code.i32Temp(FLOW_TEMP);
  code.set(temp);
  code.storeBase();
  code.get(temp);
  code.endStoreCell(checkedAddress(address));
  code.get(temp);
}

/** Emit node `at` (its power-flow index too) with everything below it; the index of the node after them. */
function emitNode(at: number, depth: number, e: Emitting): number {
  const { nodes } = e;
  const base = NODE_STRIDE * at;
  const a = nodes[base + 1]!;
  let next = at + 1;
  if (e.recordFlow) recordFlow(e, bitAt(at, e.layout.flowLeft));
  switch (nodes[base]) {
    case NODE_OP.series:
      next = emitSeries(at, a, depth, e);
      break;
    case NODE_OP.parallel:
      next = emitParallel(at, a, depth, e);
      break;
    case NODE_OP.contact:
      emitContact(a, nodes[base + 2]!, nodes[base + 3]!, e);
      break;
    case NODE_OP.coil:
      emitCoil(a, nodes[base + 2]!, nodes[base + 3]!, e);
      break;
    default:
      emitBlock(e.plan.blocks[a]!, e);
  }
  if (e.recordFlow) recordFlow(e, bitAt(at, e.layout.flowRight));
  return next;
}

/**
 * The rungs split into runs of about `CHUNK_ELEMENTS` elements (a rung counts its elements plus
 * one), as `[first, end)` rung ranges; a rung is never split.
 */
function chunkRungs(plan: Plan): Array<[number, number]> {
  const { elements } = plan.nodes;
  const chunks: Array<[number, number]> = [];
  let first = 0;
  let size = 0;
  for (let r = 0; r < elements.length; r += 1) {
    const n = elements[r]! + 1;
    if (r > first && size + n > CHUNK_ELEMENTS) {
      chunks.push([first, r]);
      first = r;
      size = 0;
    }
    size += n;
  }
  if (elements.length > first) chunks.push([first, elements.length]);
  return chunks;
}

/**
 * Input image: each input bit = its field value (bit `i % 32` of field word `i / 32`), or its
 * forced value (step 1 of the scan cycle). Without forces, a field word the image already holds
 * (see `copied` in `stateLayout.ts`) is not spread again: inputs change far less often than the
 * controller scans, and on a small program the spreading was most of the scan. With forces it is
 * spread on every scan, and the runtime marks the copy stale whenever a force comes or goes.
 */
function emitInputImage(e: Emitting): void {
  const { code, plan, layout } = e;
  const word = code.i32Temp(FIELD_WORD);
  const stale = code.i32Temp(FIELD_STALE);
  if (!e.forces && plan.space.inputs > 0) {
    code.loadCell(layout.copiedValid);
    code.op(OP.i32Eqz);
    code.set(stale);
  }
  for (let from = 0; from < plan.space.inputs; from += 32) {
    const w = from / 32;
    const to = Math.min(from + 32, plan.space.inputs);
    code.loadCell(bitAt(w, layout.field));
    code.set(word);
    if (e.forces) {
      spreadWord(e, word, from, to);
      continue;
    }
    code.when(
      () => {
        code.get(word);
        code.loadCell(bitAt(w, layout.copied));
        code.op(OP.i32Ne);
        code.get(stale);
        code.op(OP.i32Or);
      },
      () => {
        code.storeCell(bitAt(w, layout.copied), () => code.get(word));
        code.storeCell(layout.copiedValid, () => code.i32(1));
        spreadWord(e, word, from, to);
      },
    );
  }
}

/** Inputs `[from, to)` of the image from the field word in local `word` (bit 0 = input `from`). */
function spreadWord(e: Emitting, word: number, from: number, to: number): void {
  const { code, plan } = e;
  for (let i = from; i < to; i += 1) {
    code.storeBase();
    code.get(word);
    if (i !== from) {
      code.i32(i - from);
      code.op(OP.i32ShrU);
    }
    code.i32(1);
    code.op(OP.i32And);
    endStoreBit(e, plan.layout.inputs + i);
  }
}

/**
 * The module's bytes. Each rung is solved from a left rail that is ON (IEC 61131-3 clause 8.2.7
 * [memory for the sub-number]); a coil's write is visible at once to every later element.
 */
export function kernelModule(plan: Plan, layout: StateLayout, options: KernelOptions): Uint8Array {
  const { roots } = plan.nodes;
  const emitRungs = (e: Emitting, [first, end]: [number, number]): void => {
    for (let r = first; r < end; r += 1) {
      e.code.i32(1);
      emitNode(roots[r]!, 0, e);
      e.code.op(OP.drop);
    }
  };
  const contacts = new Array<Uint8Array | undefined>(CONTACTS.length * plan.sources.length);
  const emitting = (): Emitting => ({ code: new Code(), plan, nodes: plan.nodes.data, contacts, layout, recordFlow: options.recordFlow, forces: options.forces });
  const chunks = chunkRungs(plan);
  const scan = emitting();
  emitInputImage(scan);
  // A small program is solved inside `scan` itself: a call costs as much as a few rungs.
  if (chunks.length === 1) emitRungs(scan, chunks[0]!);
  const functions = chunks.length === 1 ? [] : chunks.map((rungs) => {
    const e = emitting();
    emitRungs(e, rungs);
    return e.code;
  });
  functions.forEach((_, i) => {
    scan.code.get(DT);
    scan.code.call(i);
  });
  return assembleModule([...functions, scan.code], functions.length, layout.pages);
}

/**
 * Upper bounds of the bytes one node adds to the recording module (the larger variant): its two
 * flow records, its own instructions, and for a block its inputs and its behaviour. Tested
 * against real modules.
 */
const MAX_NODE_BYTES = { series: 32, parallel: 40, contact: 56, coil: 80, block: 512 } as const satisfies Record<PlanOp, number>;

/** An upper bound of the size of a plan's recording module, in bytes (from the node counts of lowering). */
export function moduleBytesBound(plan: Plan): number {
  let bytes = 1024 + 64 * plan.space.inputs;
  for (const op of Object.keys(MAX_NODE_BYTES) as PlanOp[]) bytes += MAX_NODE_BYTES[op] * plan.nodeCounts[op];
  return bytes;
}

/**
 * The largest module compiled: a browser compiles a module on its main thread synchronously only
 * up to 8 MB (Chromium's message: "WebAssembly.Compile is disallowed on the main thread, if the
 * buffer size is larger than 8MB"; measured in Chromium 156).
 */
export const MAX_MODULE_BYTES = 8_000_000;
