/**
 * Where everything a runtime holds lives in its one block of WebAssembly memory. The machine
 * state is one contiguous range, `[0, stateBytes)`, so saving and restoring a state is one byte
 * copy (what a search over many states needs); the power-flow record follows it.
 *
 *   bits         the image: inputs, outputs, memory (one byte each, 0/1; see `BitLayout`). The
 *                output bits are the output image: between scans only a force changes them, and a
 *                force changes the output image alike
 *   field        the field value of each input, as last given (0/1), 8-aligned: the runtime
 *                writes it and the kernel reads it four inputs at a time
 *   edges        one byte per edge memory (0/1)
 *   keep         one byte per bit: 1 where a write takes effect, 0 where the bit is forced
 *   forced       one byte per bit: the forced value of a forced bit, 0 elsewhere; a write stores
 *                `(value & keep) | forced`, so the input image is a few word operations
 *   records      one record per block instance, 8-aligned: its state's numbers (f64) then its
 *                booleans (a byte each), in the order of the type's initial state
 *   flow         power on the left of every plan node, then on the right (0/1), last scan only
 */
import type { BlockType } from '../ladder/schema';
import { BLOCK_BEHAVIOURS } from './blocks/behaviours';
import type { Plan } from './plan';
import { PAGE_BYTES } from './wasm/module';

/** One field of a block's state record. */
export interface RecordField {
  readonly name: string;
  readonly kind: 'bool' | 'number';
  /** Byte offset within the record (numbers 8-aligned). */
  readonly offset: number;
}

export interface RecordLayout {
  /** Fields in the order of the type's initial state (how a snapshot spells the state). */
  readonly fields: readonly RecordField[];
  readonly byName: ReadonlyMap<string, RecordField>;
  /** Bytes, a multiple of 8. */
  readonly size: number;
}

export interface StateLayout {
  readonly field: number;
  readonly edges: number;
  readonly keep: number;
  readonly forced: number;
  /** Byte offset of each instance's record. */
  readonly records: readonly number[];
  /** Each instance's record layout. */
  readonly recordLayouts: readonly RecordLayout[];
  /** End of the machine state: `[0, stateBytes)` is everything a scan reads or writes. */
  readonly stateBytes: number;
  readonly flowLeft: number;
  readonly flowRight: number;
  /** Memory size in pages. */
  readonly pages: number;
}

const align8 = (n: number): number => Math.ceil(n / 8) * 8;

function recordLayout(type: BlockType): RecordLayout {
  const initial = BLOCK_BEHAVIOURS[type].initial as unknown as Record<string, boolean | number>;
  const names = Object.keys(initial);
  const numbers = names.filter((name) => typeof initial[name] === 'number');
  const offsets = new Map<string, number>();
  numbers.forEach((name, i) => offsets.set(name, 8 * i));
  let next = 8 * numbers.length;
  for (const name of names) if (!offsets.has(name)) offsets.set(name, next++);
  const fields = names.map((name): RecordField => ({ name, kind: typeof initial[name] === 'number' ? 'number' : 'bool', offset: offsets.get(name)! }));
  return { fields, byName: new Map(fields.map((f) => [f.name, f])), size: align8(Math.max(next, 1)) };
}

/** Record layouts by block type, derived once from the behaviour table. */
const RECORD_LAYOUTS = Object.fromEntries(
  (Object.keys(BLOCK_BEHAVIOURS) as BlockType[]).map((type) => [type, recordLayout(type)]),
) as Record<BlockType, RecordLayout>;

export function recordLayoutOf(type: BlockType): RecordLayout {
  return RECORD_LAYOUTS[type];
}

/** Lay out a plan's state. */
export function stateLayout(plan: Plan): StateLayout {
  const { size } = plan.layout;
  const field = align8(size);
  const edges = field + plan.space.inputs;
  const keep = edges + plan.edges.length;
  const forced = keep + size;
  let at = align8(forced + size);
  const records: number[] = [];
  const recordLayouts = plan.instances.map((instance) => RECORD_LAYOUTS[instance.type]);
  for (const record of recordLayouts) {
    records.push(at);
    at += record.size;
  }
  const stateBytes = at;
  const nodes = plan.flowIds.length;
  const flowLeft = stateBytes;
  const flowRight = flowLeft + nodes;
  // Slack after the end: a word-wide load near the end of an area may read up to 7 bytes past it.
  const end = flowRight + nodes + 8;
  return { field, edges, keep, forced, records, recordLayouts, stateBytes, flowLeft, flowRight, pages: Math.max(1, Math.ceil(end / PAGE_BYTES)) };
}
