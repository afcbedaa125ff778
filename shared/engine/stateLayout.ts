/**
 * Where everything a runtime holds lives in its one block of WebAssembly memory. The machine
 * state is one contiguous range, `[0, stateBytes)`, so saving and restoring a state is one byte
 * copy (what a search over many states needs); the power-flow record follows it. Every 0/1 value
 * is an i32 cell of 4 bytes (see `wasm/code.ts` for why), so bit `i` of an area is at byte
 * `area + 4 i`; all addresses here are in bytes.
 *
 *   bits         the image: inputs, outputs, memory, from byte 0 (see `BitLayout`). The output
 *                bits are the output image: between scans only a force changes them, and a force
 *                changes the output image alike
 *   field        the field value of each input, as last given: one bit per input in i32 words
 *                (input `i` is bit `i % 32` of word `i / 32`), so a runtime gives a scan all its
 *                inputs with one or two stores; the kernel spreads them into the input image
 *   copied       the field words the input image was last spread from, then one cell that is 1
 *                while the input image still holds exactly them (the runtime clears it when it
 *                writes the image itself: a force, a restore, a power cycle), so a scan whose
 *                field is unchanged skips the spreading: on the 3-rung demo that was a third of
 *                the kernel
 *   edges        one cell per edge memory
 *   keep         one cell per bit: 1 where a write takes effect, 0 where the bit is forced
 *   forced       one cell per bit: the forced value of a forced bit, 0 elsewhere; a write stores
 *                `(value & keep) | forced`
 *   records      one record per block instance, 8-aligned: its state's numbers (f64) then its
 *                booleans (a cell each), in the order of the type's initial state
 *   flow         power on the left of every plan node, then on the right, last scan only
 */
import type { BlockType } from '../ladder/schema';
import { BLOCK_BEHAVIOURS } from './blocks/behaviours';
import type { Plan } from './plan';
import { PAGE_BYTES } from './wasm/module';
import { CELL } from './wasm/opcodes';

/** One field of a block's state record. */
export interface RecordField {
  readonly name: string;
  readonly kind: 'bool' | 'number';
  /** Byte offset within the record (numbers 8-aligned, booleans a cell each). */
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
  /** Words of the field area (32 inputs each). */
  readonly fieldWords: number;
  /** The field words last spread into the input image (`fieldWords` cells), then the cell that says the image still holds them. */
  readonly copied: number;
  readonly copiedValid: number;
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
  for (const name of names) {
    if (offsets.has(name)) continue;
    offsets.set(name, next);
    next += CELL;
  }
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
  const field = align8(CELL * size);
  const fieldWords = Math.ceil(plan.space.inputs / 32);
  const copied = field + CELL * fieldWords;
  const copiedValid = copied + CELL * fieldWords;
  const edges = copiedValid + CELL;
  const keep = edges + CELL * plan.edges.length;
  const forced = keep + CELL * size;
  let at = align8(forced + CELL * size);
  const records: number[] = [];
  const recordLayouts = plan.instances.map((instance) => RECORD_LAYOUTS[instance.type]);
  for (const record of recordLayouts) {
    records.push(at);
    at += record.size;
  }
  const stateBytes = at;
  const nodes = plan.flowIds.length;
  const flowLeft = stateBytes;
  const flowRight = flowLeft + CELL * nodes;
  const end = flowRight + CELL * nodes;
  return { field, fieldWords, copied, copiedValid, edges, keep, forced, records, recordLayouts, stateBytes, flowLeft, flowRight, pages: Math.max(1, Math.ceil(end / PAGE_BYTES)) };
}
