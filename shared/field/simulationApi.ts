/**
 * The public shape of a simulation (see `simulation.ts` for how it runs): its options, the result
 * of creating one, and what it offers the panel view, the check runner and the command line.
 */
import type { Diagnostic, Runtime } from '../engine';
import type { SavedState } from '../engine/runtime';
import type { ActionArgs, DeviceAction, DeviceInputs } from './devices/model';
import type { EventLog, FieldEvent } from './events';
import type { IoExplanation } from './explain';
import type { PanelLayout } from './layout';
import type { Program } from '../ladder/schema';
import type { DeviceView } from './views';

export interface SimulationOptions {
  program: Program;
  /** A layout accepted by `parsePanelLayout` (or a built-in panel). */
  panel: PanelLayout;
  /** Scan period in ms, 1..1000; 10 if omitted. */
  scanMs?: number;
  /** How many events the log keeps (the latest ones); 10 000 if omitted. */
  maxEvents?: number;
  /** Record the engine's power flow from the first scan (a live view wants it; grading does not). */
  recordPowerFlow?: boolean;
}

/**
 * A running simulation, or why there is none: the program's compile errors as located diagnostics,
 * and a one-line summary (also used for a bad scan period, which has no diagnostics).
 */
export type SimulationResult =
  | { ok: true; simulation: Simulation; warnings: Diagnostic[] }
  | { ok: false; diagnostics: Diagnostic[]; error: string };

/**
 * The field's device states, to carry a running panel over to a simulation of an edited program
 * (the e-stop stays latched, the motor keeps turning). States are immutable, so sharing them is safe.
 */
export interface FieldSnapshot {
  readonly panelId: string;
  readonly deviceIds: readonly string[];
  readonly states: readonly unknown[];
  readonly inputs: readonly DeviceInputs[];
}

/**
 * The whole state (engine and field) as it stood before a scan, to tell afterwards whether that
 * scan was quiet (`Simulation.quietScans`). Reused from probe to probe; treat as opaque.
 */
export interface QuietProbe {
  engine: SavedState;
  states: unknown[];
  words: string[];
}

/** The outcome of a device action: done, or why not (also logged as a `refused` event). */
export type ActionResult = { ok: true } | { ok: false; error: string };

export interface Simulation {
  readonly panel: PanelLayout;
  /** The engine: forces, reads, power flow, snapshot. */
  readonly runtime: Runtime;
  readonly scanMs: number;
  readonly timeMs: number;
  readonly scanCount: number;
  /** One scan cycle (steps 1-4 above). */
  scan(): void;
  /** Whole scans covering `ms` of virtual time: ceil(ms / scanMs). */
  run(ms: number): void;
  /** Perform an action on a device by id; `args.to` for `set`, `args.factor` for `load`. */
  act(deviceId: string, action: DeviceAction, args?: ActionArgs): ActionResult;
  press(deviceId: string): ActionResult;
  release(deviceId: string): ActionResult;
  set(deviceId: string, position: string): ActionResult;
  trip(deviceId: string): ActionResult;
  reset(deviceId: string): ActionResult;
  load(deviceId: string, factor: number): ActionResult;
  block(deviceId: string): ActionResult;
  unblock(deviceId: string): ActionResult;
  /** A device's state word (`closed`, `lit`, `tripped`, `RUN`…), or undefined for an unknown id. */
  word(deviceId: string): string | undefined;
  device(deviceId: string): DeviceView | undefined;
  devices(): DeviceView[];
  /** Is every contact of the input common closed (true when it has none)? */
  inputCommonLive(): boolean;
  outputCommonLive(): boolean;
  /** Is a load's circuit energised after the last scan (output, common, series contacts)? */
  energised(deviceId: string): boolean;
  events(): readonly FieldEvent[];
  eventsSince(seq: number): readonly FieldEvent[];
  readonly eventLog: EventLog;
  /** The I/O status table: each input and output with its circuit and the reason in words. */
  explain(): IoExplanation;
  /** The field's device states (see `FieldSnapshot`). */
  fieldSnapshot(): FieldSnapshot;
  /** Put back a field snapshot of the same panel; false, and nothing changed, when it does not fit. */
  restoreField(snapshot: FieldSnapshot): boolean;
  /**
   * The device states alone, in layout order, into `into` when given (no allocation then): for a
   * search over many states (shared/proof), where the per-device inputs are recomputed every scan.
   */
  fieldStates(into?: unknown[]): unknown[];
  /** Put back device states from `fieldStates` of this simulation (contacts and words follow). */
  loadFieldStates(states: readonly unknown[]): void;
  /**
   * Start an overload relay "hot": its thermal image at the steady state of carrying `factor` × its
   * setting (IEC 60947-4-1's hot state at 1). Not an operator's action, so nothing is logged.
   */
  preheat(deviceId: string, factor: number): ActionResult;
  /** The controller loses power (`Runtime.powerOff`): outputs open, the field goes on; logged. */
  powerOff(): void;
  /** Power returns to the controller: a warm restart (`Runtime.powerOn`); logged. */
  powerOn(): void;
  /** Keep the state as it is now, before a scan (into `into` when given: no allocation then). */
  probe(into?: QuietProbe): QuietProbe;
  /**
   * After exactly one scan since `probe`, and nothing done to the panel or the forces: how many
   * further scans are certain to change no bit, no device word and log no event — the program at
   * a fixed point but for running timers, every device at rest but for closed forms (the
   * overload's image). Infinity at a fixed point; 0 when the next scan must run. `timers` false
   * admits no running timer (for a caller that watches an elapsed time).
   */
  quietScans(probe: QuietProbe, timers?: boolean): number;
  /** Count `scans` quiet scans without running them (after `quietScans` allowed as many): the same state, exactly. */
  leap(scans: number): void;
}
