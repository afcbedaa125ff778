/**
 * The mutable heart of a runtime, shared by the runtime (`scanRuntime.ts`) and the snapshot code.
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
  forces: Map<string, ForcedBit>;
  scanCount: number;
  timeMs: number;
}
