/**
 * The runtime: one simulated controller running a plan in virtual time. A scan is
 *   1. input image ← the field inputs (an input force overrides the field value),
 *   2. solve the rungs top to bottom (a coil's write is seen at once by later rungs; a forced
 *      output or memory bit keeps its forced value whatever the coil says),
 *   3. output image ← the output bits,
 *   4. virtual time += the scan period.
 * Nothing here reads a clock or a random source: the same inputs give the same run, scan for scan.
 * This file is the contract; `createRuntime` and the implementation are in `scanRuntime.ts`.
 */
import type { Result } from '../ladder/result';
import { fail, ok } from '../ladder/result';
import type { ForcedBit } from './core';
import type { Plan } from './plan';
import type { PowerFlowView } from './powerFlow';
import type { RestoreReport, RuntimeSnapshot } from './snapshot';

export interface RuntimeOptions {
  /** Scan period in ms, a whole number from 1 to 1000; 10 if absent. */
  scanMs?: number;
  /**
   * Record power flow from the first scan (a live view). Without it nothing is recorded until the
   * first `powerFlow()` call, whose view is then empty (`recorded: false`) until the next scan;
   * a runtime nobody watches (grading, the command line) never pays for it.
   */
  recordPowerFlow?: boolean;
}

/**
 * The whole machine state as raw bytes, for a search that visits many states: `saveState` and
 * `loadState` are one copy each. Only meaningful for a runtime of the same plan; treat as opaque.
 */
export interface SavedState {
  bytes: Uint8Array;
  scanCount: number;
  timeMs: number;
  /** The forces in effect (shared, never changed: a new map is made when forces change). */
  forces: ReadonlyMap<string, ForcedBit>;
}

export interface Runtime {
  readonly plan: Plan;
  /** Scan period, ms (1..1000). */
  readonly scanMs: number;
  /** Scans run so far. */
  readonly scanCount: number;
  /** Virtual time, ms: the scans run so far times the scan period. */
  readonly timeMs: number;
  /** The field value of `%IX<index>` (1-based) for the next input scan. */
  setInput(index: number, value: boolean): void;
  /** Set every field input at once: `values[0]` is `%IX1`; missing entries leave their input as it was. */
  setInputs(values: ArrayLike<boolean>): void;
  /** `%QX<index>` (1-based) in the output image after the last scan, forces applied. */
  getOutput(index: number): boolean;
  /** Any address, tag or block member (`T1.ET` in ms, `C1.CV`); `undefined` if it names nothing here. */
  read(operand: string): boolean | number | undefined;
  /** Run one scan. */
  scan(): void;
  /** Run whole scans covering `ms`: ceil(ms / scanMs) of them. */
  run(ms: number): void;
  /** Force a bit (address or tag): an input force overrides the field, an output/memory force overrides coil writes. */
  force(operand: string, value: boolean): Result<void>;
  unforce(operand: string): void;
  clearForces(): void;
  /** The forces in effect, keyed by canonical address (`%IX1`). */
  forces(): ReadonlyMap<string, boolean>;
  /** Power flow of the last scan (see `RuntimeOptions.recordPowerFlow`). */
  powerFlow(): PowerFlowView;
  /** Plain, serialisable copy of the whole state. */
  snapshot(): RuntimeSnapshot;
  /**
   * Put a snapshot back. Parts that do not fit this plan (an instance that no longer exists or has
   * another type, a bit outside this panel) are skipped and listed in the report.
   */
  restore(snapshot: RuntimeSnapshot): RestoreReport;
  /** Copy the machine state out, into `into` when given (no allocation then). */
  saveState(into?: SavedState): SavedState;
  /** Put a state from `saveState` back: forces, field values, time and all. */
  loadState(state: SavedState): void;
}

/** The scan period limits, ms. */
export const SCAN_MS_MIN = 1;
export const SCAN_MS_MAX = 1000;
export const DEFAULT_SCAN_MS = 10;

/** Check a scan period someone typed. */
export function checkScanMs(value: number): Result<number> {
  if (!Number.isInteger(value) || value < SCAN_MS_MIN || value > SCAN_MS_MAX) {
    return fail(`the scan period must be a whole number of milliseconds from ${SCAN_MS_MIN} to ${SCAN_MS_MAX}, not ${String(value)}`);
  }
  return ok(value);
}
