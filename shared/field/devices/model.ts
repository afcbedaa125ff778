/**
 * The shape every virtual field device shares: its parameters (a zod schema, so a panel layout is
 * validated data), its contacts, its state words and a pure model — `step(state, params, inputs,
 * dtMs) -> state` plus actions a student or a check script performs. A model never mutates a state:
 * it returns a new one, or the same object when nothing changed (the simulation relies on that to
 * skip work and to notice changes).
 */
import type { z } from 'zod';

/** Every kind of device a panel layout can hold. */
export type DeviceKind =
  | 'pushbutton'
  | 'estop'
  | 'selector'
  | 'contactor'
  | 'interlock'
  | 'overload'
  | 'lamp'
  | 'horn'
  | 'motor'
  | 'photoeye'
  | 'limit';

/** What a student (or a check script) can do to a device. */
export type DeviceAction = 'press' | 'release' | 'set' | 'trip' | 'reset' | 'load' | 'block' | 'unblock';

export const DEVICE_ACTIONS: readonly DeviceAction[] = ['press', 'release', 'set', 'trip', 'reset', 'load', 'block', 'unblock'];

/** Normally open or normally closed, as the contact sits with the device at rest. */
export type ContactForm = 'NO' | 'NC';

/** One contact a device offers to the wiring, named by its terminal marking where the trade has one. */
export interface ContactSpec {
  /** Terminal marking, e.g. `13-14` (NO) or `95-96` (the overload's NC contact). */
  name: string;
  form: ContactForm;
}

/** Which way a motor's supply turns it. */
export type Supply = 'none' | 'forward' | 'reverse';

/**
 * What the hardwired circuits hand a device for one field step. Each model reads only the fields
 * it needs; the simulation fills them from the panel layout.
 */
export interface DeviceInputs {
  /** A load (coil, lamp, horn) has power: output ON, output common live, series contacts closed. */
  energised: boolean;
  /** A contactor is held open by a mechanical interlock this step. */
  blocked: boolean;
  /** An interlock saw both its coils energised while both contactors were open. */
  conflict: boolean;
  /** A motor's supply through the contactors' main contacts. */
  supply: Supply;
  /** The current through an overload relay's heaters, in A. */
  currentA: number;
}

/**
 * A coupling to another device named in this one's parameters: the wiring builds the circuits
 * from these, and the layout check makes sure the named device exists and is of `kind`.
 *  - `interlocks`: a mechanical interlock's two contactors (held open against each other);
 *  - `fedBy`: a contactor whose main contacts feed a motor, turning it `direction`;
 *  - `measures`: the motor whose current an overload relay's heaters carry.
 */
export interface DeviceLink {
  readonly role: 'interlocks' | 'fedBy' | 'measures';
  /** The other device, by id. */
  readonly device: string;
  readonly kind: DeviceKind;
  /** Where in the parameters it is named, for messages: `contactors[0]`. */
  readonly path: string;
  readonly direction?: 'forward' | 'reverse';
}

/** Extra values some actions take: a selector position, a load factor (multiple of FLA). */
export interface ActionArgs {
  to?: string;
  factor?: number;
}

/** An action either gives the next state or says, in words, why it cannot be done now. */
export type ActionOutcome<S> = { ok: true; state: S } | { ok: false; error: string };

/**
 * The actions a model supports. Written as methods so a concrete model fits the generic table
 * (method parameters are compared bivariantly by TypeScript).
 */
export interface DeviceActions<P, S> {
  press?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
  release?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
  set?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
  trip?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
  reset?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
  load?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
  block?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
  unblock?(state: S, params: P, args: ActionArgs): ActionOutcome<S>;
}

/** A device kind's behaviour. `P` = parameters after defaults, `S` = state. */
export interface DeviceModel<P, S> {
  readonly kind: DeviceKind;
  /** The kind with its article, for messages: "a contactor". */
  readonly noun: string;
  /** Validates and fills in the `params` of a layout entry. */
  readonly params: z.ZodType<P>;
  contacts(params: P): readonly ContactSpec[];
  initial(params: P): S;
  isClosed(state: S, params: P, contact: string): boolean;
  /** The state in one word, as check scripts name it: `closed`, `lit`, `tripped`, `RUN`… */
  word(state: S, params: P): string;
  /** Every word `word` can return for these parameters. */
  words(params: P): readonly string[];
  /** Advance by `dtMs` of virtual time. Absent for devices that only change by actions. */
  step?(state: S, params: P, inputs: DeviceInputs, dtMs: number): S;
  /**
   * For a device that keeps changing at rest in a known closed form (the overload's thermal image):
   * given its state `before` and `after` one step with `inputs`, how many further steps with the
   * same inputs are certain to keep its word (so its contacts and messages): Infinity for never a
   * change, 0 when it cannot say. Such a device must be read by the others only through its
   * contacts. Absent: a device is quiet only when a step returns the very same state.
   */
  quietSteps?(before: S, after: S, params: P, inputs: DeviceInputs, dtMs: number): number;
  /** The state after `steps` more steps with `inputs`, exactly what stepping gives (after `quietSteps` allowed them). */
  leap?(state: S, params: P, inputs: DeviceInputs, dtMs: number, steps: number): S;
  readonly actions: DeviceActions<P, S>;
  /** An output may drive it (a coil, a lamp, a horn): it is a load with `inputs.energised`. */
  readonly load?: true;
  /** Its couplings to other devices (see `DeviceLink`); none if absent. */
  links?(params: P): readonly DeviceLink[];
  /** Problems of its parameters that need the whole panel's view, relative to `params` (`contactors: …`). */
  checkLinks?(params: P): readonly string[];
  /** What the field gathers for its step besides `energised`: the supply through its feeders, or the current it measures. */
  readonly gathers?: 'supply' | 'current';
  /** For a load: why its state differs from its circuit right now, in words (`picking up`), or ''. */
  explainLoad?(state: S, energised: boolean): string;
}

/** Shorthand for a successful action. */
export function done<S>(state: S): ActionOutcome<S> {
  return { ok: true, state };
}

/** Shorthand for a refused action. */
export function refused<S>(error: string): ActionOutcome<S> {
  return { ok: false, error };
}
