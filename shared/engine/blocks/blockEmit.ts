/**
 * What a block's WebAssembly emitter is given for one call site. The kernel has already evaluated
 * every input into a local before the emitter runs (the reference step also receives all its
 * inputs before it changes anything, and an input may read the very instance being called, e.g.
 * `PV: C1.CV` on C1), so an emitter reads inputs and its own state fields and writes only its own
 * state fields. The kernel then passes on the power-flow output (`BLOCK_SPECS[type].powerOut`).
 */
import type { Code } from '../wasm/code';

export interface BlockEmit {
  readonly code: Code;
  /** Byte address of one of this instance's state fields (a name of its state, e.g. `ET`). */
  field(name: string): number;
  /** Push a BOOL input (0/1), the power-flow input included. */
  bool(name: string): void;
  /** Push a TIME (ms) or INT input as an f64. */
  number(name: string): void;
  /** Push the time this call is charged, ms (f64): the scan period, or 0 for a second call in a scan. */
  dt(): void;
  /** Scratch locals for the emitter's own use (indices 0 and 1 of each type). */
  i32(n: 0 | 1): number;
  f64(n: 0 | 1): number;
}
