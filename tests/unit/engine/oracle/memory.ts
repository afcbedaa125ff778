/**
 * The reference machine's memory: plain typed arrays and immutable block-state objects, as the
 * engine kept them before it compiled to WebAssembly. Only the test oracle uses it.
 */
import { BLOCK_BEHAVIOURS, type BlockState } from '@shared/engine/blocks/behaviours';
import type { Plan } from '@shared/engine/plan';

/** Everything a scan reads and writes. */
export interface Memory {
  /** The bit image: inputs, outputs, memory (see `BitLayout`). */
  readonly bits: Uint8Array;
  /** One byte per edge memory: the value examined (contacts) in the previous scan. */
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
    bits: new Uint8Array(plan.layout.size),
    edges: new Uint8Array(plan.edges.length),
    states: plan.instances.map((instance) => BLOCK_BEHAVIOURS[instance.type].initial),
    keep: new Uint8Array(plan.layout.size).fill(1),
    forced: new Uint8Array(plan.layout.size),
  };
}
