/**
 * The mutable heart of a runtime, what the snapshot code reads and writes; the runtime
 * (`scanRuntime.ts`) is one, so a scan updates its own fields and nothing else.
 */
import type { Machine } from './machine';
import type { Plan } from './plan';

/** A forced bit: its index in the bit image and its value. */
export interface ForcedBit {
  readonly bit: number;
  readonly value: boolean;
}

export interface RuntimeCore {
  readonly plan: Plan;
  readonly scanMs: number;
  readonly machine: Machine;
  /** Forced bits by canonical address (`%IX1`). */
  forcedBits: Map<string, ForcedBit>;
  scanCount: number;
  timeMs: number;
}
