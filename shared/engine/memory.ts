/**
 * The typed memory a plan runs over, and the rules every evaluator shares for contacts and coils.
 * Bits are 0 or 1 in a `Uint8Array` (never other values), so series is `&`, parallel is `|` and
 * negation is `^ 1`, the same in the interpreter and in generated code.
 */
import type { CoilVariant, ContactVariant } from '../ladder/schema';
import { BLOCK_BEHAVIOURS, type BlockState } from './blocks/behaviours';
import type { Plan } from './plan';

/** Everything a scan reads and writes. */
export interface Memory {
  /** The bit image: inputs, outputs, memory (see `BitLayout`). */
  readonly bits: Uint8Array;
  /** One memory per edge contact: the value it examined in the previous scan. */
  readonly edges: Uint8Array;
  /** One state per block instance (immutable objects, replaced on every call). */
  readonly states: BlockState[];
  /** 1 where a coil write takes effect, 0 where the bit is forced. */
  readonly keep: Uint8Array;
  /** The forced value of a forced bit; 0 elsewhere. A write stores `(value & keep) | forced`. */
  readonly forced: Uint8Array;
}

/** Fresh memory for a plan: all bits FALSE, every block in its initial state, nothing forced. */
export function createMemory(plan: Plan): Memory {
  return {
    bits: paddedBytes(plan.layout.size),
    edges: paddedBytes(plan.edges.length),
    states: plan.instances.map((instance) => BLOCK_BEHAVIOURS[instance.type].initial),
    keep: new Uint8Array(plan.layout.size).fill(1),
    forced: new Uint8Array(plan.layout.size),
  };
}

/**
 * A byte array whose buffer is a whole number of 32-bit words, so that a copy can go word by word
 * (`wordsOf`): copying the image before each scan (for the power-flow replay) then costs a few
 * nanoseconds instead of a library call.
 */
function paddedBytes(length: number): Uint8Array {
  return new Uint8Array(new ArrayBuffer(Math.ceil(length / 4) * 4), 0, length);
}

/** The 32-bit words over a padded byte array's whole buffer. */
export function wordsOf(bytes: Uint8Array): Int32Array {
  return new Int32Array(bytes.buffer, 0, bytes.buffer.byteLength / 4);
}

/**
 * What each contact passes, from the examined value `v` and, for edge contacts, the value `last` it
 * examined in the previous scan (IEC 61131-3 clause 8.2.4 [memory for the sub-number]): NO passes
 * when TRUE, NC when FALSE, rising when FALSE→TRUE, falling when TRUE→FALSE.
 */
export const CONTACT_PASSES = {
  no: (v: number) => v,
  nc: (v: number) => v ^ 1,
  rising: (v: number, last: number) => v & (last ^ 1),
  falling: (v: number, last: number) => (v ^ 1) & last,
} as const satisfies Record<ContactVariant, (v: number, last: number) => number>;

/**
 * The value each coil leaves in its variable, from the power `p` on its left and the variable's
 * `old` value (IEC 61131-3 clause 8.2.5 [memory for the sub-number]): a coil writes p, a negated
 * coil NOT p; a set coil sets on p and otherwise leaves it; a reset coil clears on p.
 */
export const COIL_WRITES = {
  coil: (p: number) => p,
  negated: (p: number) => p ^ 1,
  set: (p: number, old: number) => p | old,
  reset: (p: number, old: number) => old & (p ^ 1),
} as const satisfies Record<CoilVariant, (p: number, old: number) => number>;

/** True for contacts that keep an edge memory. */
export const isEdgeVariant = (variant: ContactVariant): boolean => variant === 'rising' || variant === 'falling';
