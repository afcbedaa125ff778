/**
 * How the proof sees each kind of field device: what the environment (the operator, the machine)
 * may do to it between two scans, how its state is reduced to what matters, and a short code of
 * that state for the visited-state set. One entry per kind, so a new kind that is not described
 * here fails to compile.
 *
 * Abstracted, on purpose (and said so in every report, `ABSTRACTIONS`):
 *  - the motor's speed and current: a motor has no contact the program or the circuits read, only
 *    the overload's thermal image depends on it, so its state is dropped after every scan;
 *  - the overload's thermal image: the environment trips or resets the relay whenever it chooses
 *    (a superset of what the heaters can do), so the relay is only `ok` or `tripped`.
 * Every other device is exact: contactor pick-up and drop-out in whole scans, the mechanical
 * interlock, the auxiliary contacts, the hardwired commons and series contacts.
 */
import type { ContactorState } from '../field/devices/contactor';
import type { DeviceAction, DeviceKind } from '../field/devices/model';
import type { OverloadState } from '../field/devices/overload';
import type { SelectorParams, SelectorState } from '../field/devices/selector';

/** One thing the environment may do to a device: a check-script step. */
export interface EnvMove {
  action: DeviceAction;
  to?: string;
}

export interface KindAbstraction {
  /** The moves that change the device from this state (none for a device nobody handles). */
  moves(state: unknown, params: unknown): readonly EnvMove[];
  /** The state the search keeps (the same object when nothing is abstracted). */
  reduce(state: unknown, params: unknown, initial: unknown): unknown;
  /** A short code of the reduced state. */
  code(state: unknown, params: unknown): string;
}

const flag = (on: boolean): string => (on ? '1' : '0');
const NONE: readonly EnvMove[] = [];
const PRESS: readonly EnvMove[] = [{ action: 'press' }];
const RELEASE: readonly EnvMove[] = [{ action: 'release' }];
const BLOCK: readonly EnvMove[] = [{ action: 'block' }];
const UNBLOCK: readonly EnvMove[] = [{ action: 'unblock' }];
const TRIP: readonly EnvMove[] = [{ action: 'trip' }];
const RESET: readonly EnvMove[] = [{ action: 'reset' }];

const keep = (state: unknown): unknown => state;

const pressable = (field: string): KindAbstraction => ({
  moves: (state) => ((state as Record<string, boolean>)[field] ? RELEASE : PRESS),
  reduce: keep,
  code: (state) => flag((state as Record<string, boolean>)[field]!),
});

const blockable = (field: string): KindAbstraction => ({
  moves: (state) => ((state as Record<string, boolean>)[field] ? UNBLOCK : BLOCK),
  reduce: keep,
  code: (state) => flag((state as Record<string, boolean>)[field]!),
});

const poweredOnly: KindAbstraction = { moves: () => NONE, reduce: keep, code: (state) => flag((state as { on: boolean }).on) };

export const KIND_ABSTRACTIONS = {
  pushbutton: pressable('pressed'),
  estop: pressable('latched'),
  selector: {
    moves: (state, params) => {
      const at = (state as SelectorState).position;
      return (params as SelectorParams).positions.filter((p) => p !== at).map((to): EnvMove => ({ action: 'set', to }));
    },
    reduce: keep,
    code: (state, params) => String((params as SelectorParams).positions.indexOf((state as SelectorState).position)),
  },
  photoeye: blockable('blocked'),
  limit: blockable('actuated'),
  contactor: {
    moves: () => NONE,
    reduce: keep,
    code: (state) => {
      const s = state as ContactorState;
      return `${flag(s.closed)}${flag(s.held)}${s.movingMs}`;
    },
  },
  interlock: { moves: () => NONE, reduce: keep, code: (state) => flag((state as { conflict: boolean }).conflict) },
  overload: {
    moves: (state) => ((state as OverloadState).tripped ? RESET : TRIP),
    // Only the latch is kept: the image goes back to cold after every scan.
    reduce: (state, _params, initial) => {
      const s = state as OverloadState;
      const cold = initial as OverloadState;
      if (s.tripped === cold.tripped && s.theta === cold.theta && s.overMs === cold.overMs && s.currentA === cold.currentA) return initial;
      return s.tripped ? { ...cold, tripped: true, cause: 'manual' } : cold;
    },
    code: (state) => flag((state as OverloadState).tripped),
  },
  lamp: poweredOnly,
  horn: poweredOnly,
  // Speed and current dropped: nothing the program or a circuit reads depends on them.
  motor: { moves: () => NONE, reduce: (_state, _params, initial) => initial, code: () => '' },
} as const satisfies Record<DeviceKind, KindAbstraction>;

/** What every report says about the model it explored. */
export const ABSTRACTIONS: readonly string[] = [
  'motor speed and current are not modelled: a property may not name a motor (name its contactors instead)',
  'the overload thermal image is not modelled: the environment may trip or reset a relay at any scan (a reset in a counterexample is preceded by "preheat 0", the relay taken as cooled)',
  'the motor load ("load" steps) is not an action of the environment',
];

/** The device kinds a property may not name, with why. */
export const UNOBSERVABLE_KINDS: Partial<Record<DeviceKind, string>> = {
  motor: 'its speed is not modelled by the proof; name its contactors instead (e.g. "K1": "closed")',
};
