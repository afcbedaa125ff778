/**
 * Thermal overload relay: heaters in the motor's supply warm a thermal image (see `thermal.ts`);
 * when it reaches the trip level the relay trips and latches: 95-96 (NC, in series with the
 * contactor coils) opens and 97-98 (NO, the signal contact to the PLC) closes. A test button trips
 * it by hand. It resets by hand only once it has cooled enough.
 *
 * Reset threshold: the image must have fallen to 1.0 (the steady image of running at exactly the
 * current setting), i.e. a thermal level of 1/k² ≈ 0.79 of trip. Below that a motor restarted onto
 * a normal full load settles under the trip level instead of tripping again at once; real relays
 * enforce a similar recovery time (a few minutes, common practice). For class 10 after a trip from
 * cold that is about τ·ln(k²) ≈ 76 s of cooling.
 */
import { z } from 'zod';
import { done, refused, type ContactSpec, type DeviceModel } from './model';
import { advanceImage, DEFAULT_TRIP_FACTOR, timeConstantS, TRIP_CLASSES, type TripClass } from './thermal';

export const OverloadParamsSchema = z.object({
  /** Current setting in A (set to the motor's FLA or nameplate current). */
  settingA: z.number().positive().max(10_000),
  tripClass: z.enum(TRIP_CLASSES as [TripClass, ...TripClass[]]).default('10'),
  /** The motor whose supply runs through the heaters, by device id. */
  motor: z.string().optional(),
  /** Trip factor k (trip at θ = k²); between 1.05 and 1.2. */
  tripFactor: z.number().min(1.05).max(1.2).default(DEFAULT_TRIP_FACTOR),
});
export type OverloadParams = z.infer<typeof OverloadParamsSchema>;

export interface OverloadState {
  /** Thermal image in (per unit of the setting)²; 0 = cold. */
  readonly theta: number;
  /**
   * The image when the current last changed, and the time since then at this current, in ms:
   * `theta` is always the closed form from them (`advanceImage(baseTheta, I, sinceMs)`), so n steps
   * and one leap of n steps give the very same number.
   */
  readonly baseTheta: number;
  readonly sinceMs: number;
  readonly tripped: boolean;
  /** What tripped it, for the event log. */
  readonly cause: 'thermal' | 'manual' | null;
  /** How long the current has stayed above the setting, in ms (for "tripped after 8.0 s"). */
  readonly overMs: number;
  /** The last current seen, in A. */
  readonly currentA: number;
  /** The thermal time constant in s for this relay's class (fixed; kept here so a step need not recompute it). */
  readonly tauS: number;
}

const CONTACTS: readonly ContactSpec[] = [
  { name: '95-96', form: 'NC' },
  { name: '97-98', form: 'NO' },
];

/** Below this the image counts as fully cold (lets a cooling relay reach a fixed state). */
const COLD_EPSILON = 1e-9;

/** Thermal level 0..1+: the image as a fraction of the trip level. */
export function thermalLevel(state: OverloadState, params: OverloadParams): number {
  return state.theta / (params.tripFactor * params.tripFactor);
}

/** The thermal level at or below which a hand reset is accepted (1/k²; see the module comment). */
export function resetLevel(params: OverloadParams): number {
  return 1 / (params.tripFactor * params.tripFactor);
}

function tauOf(params: OverloadParams): number {
  return timeConstantS(params.tripClass, params.tripFactor);
}

/** The state `steps` steps of `dtMs` at `currentA` on from `state` (one step, or a leap). */
function advanced(state: OverloadState, params: OverloadParams, currentA: number, dtMs: number, steps: number): OverloadState {
  const perUnit = currentA / params.settingA;
  const same = currentA === state.currentA;
  const baseTheta = same ? state.baseTheta : state.theta;
  const sinceMs = (same ? state.sinceMs : 0) + steps * dtMs;
  const theta = advanceImage(baseTheta, perUnit, sinceMs, state.tauS);
  const overMs = perUnit > 1 ? state.overMs + steps * dtMs : 0;
  if (currentA === 0 && theta < COLD_EPSILON) {
    return { theta: 0, baseTheta: 0, sinceMs: 0, tripped: state.tripped, cause: state.cause, overMs: 0, currentA: 0, tauS: state.tauS };
  }
  const k2 = params.tripFactor * params.tripFactor;
  const tripsNow = !state.tripped && theta >= k2;
  return {
    theta,
    baseTheta,
    sinceMs,
    tripped: state.tripped || tripsNow,
    cause: tripsNow ? 'thermal' : state.cause,
    overMs,
    currentA,
    tauS: state.tauS,
  };
}

/** Steps this far before the computed trip are never leapt, whatever exp's last bit does. */
const TRIP_MARGIN_STEPS = 2;

export const overload: DeviceModel<OverloadParams, OverloadState> = {
  kind: 'overload',
  noun: 'an overload relay',
  params: OverloadParamsSchema,
  contacts: () => CONTACTS,
  initial: (params) => ({ theta: 0, baseTheta: 0, sinceMs: 0, tripped: false, cause: null, overMs: 0, currentA: 0, tauS: tauOf(params) }),
  isClosed: (state, _params, contact) => (contact === '95-96' ? !state.tripped : state.tripped),
  word: (state) => (state.tripped ? 'tripped' : 'ok'),
  words: () => ['ok', 'tripped'],
  gathers: 'current',
  links: (params) => (params.motor === undefined ? [] : [{ role: 'measures' as const, device: params.motor, kind: 'motor' as const, path: 'motor' }]),
  step(state, params, inputs, dtMs) {
    const current = inputs.currentA;
    if (current === 0 && state.theta === 0 && state.currentA === 0 && state.overMs === 0) return state;
    return advanced(state, params, current, dtMs, 1);
  },
  quietSteps(before, after, params, inputs, dtMs) {
    // Quiet only on a run at one current already anchored (the step just taken continued it).
    if (inputs.currentA !== after.currentA || before.currentA !== after.currentA || after.sinceMs !== before.sinceMs + dtMs) return 0;
    if (after.tripped !== before.tripped) return 0;
    // Tripped, the word stays "tripped" however it cools (reaching cold is no word change).
    if (after.tripped) return Number.POSITIVE_INFINITY;
    const perUnit = after.currentA / params.settingA;
    const target = perUnit * perUnit;
    const k2 = params.tripFactor * params.tripFactor;
    // Below the trip level the image tends to a value under it: never a trip.
    if (target < k2) return Number.POSITIVE_INFINITY;
    // θ(t) = target + (base − target)·e^(−t/τ) reaches k² at t = τ·ln((target − base)/(target − k²)).
    const tripMs = after.tauS * 1000 * Math.log((target - after.baseTheta) / (target - k2));
    if (!Number.isFinite(tripMs)) return 0;
    const firstTripStep = Math.ceil((tripMs - after.sinceMs) / dtMs);
    let quiet = Math.max(0, firstTripStep - 1 - TRIP_MARGIN_STEPS);
    // The image rises monotonically here; make sure the last leapt step is still below the trip.
    while (quiet > 0 && advanceImage(after.baseTheta, perUnit, after.sinceMs + quiet * dtMs, after.tauS) >= k2) quiet -= 1;
    return quiet;
  },
  leap: (state, params, inputs, dtMs, steps) => advanced(state, params, inputs.currentA, dtMs, steps),
  actions: {
    trip: (state) => (state.tripped ? done(state) : done({ ...state, tripped: true, cause: 'manual' })),
    reset(state, params) {
      if (!state.tripped) return done(state);
      const level = thermalLevel(state, params);
      const limit = resetLevel(params);
      if (level > limit) {
        const tau = state.tauS;
        const k2 = params.tripFactor * params.tripFactor;
        // Cooling at no current: θ(t) = θ0·e^(−t/τ); reset allowed at θ = 1.
        const waitS = tau * Math.log((level * k2) / 1);
        return refused(
          `still too hot to reset: thermal level ${level.toFixed(2)} of trip, resets at ${limit.toFixed(2)} ` +
            `(about ${Math.ceil(waitS)} s more with the motor off)`,
        );
      }
      return done({ ...state, tripped: false, cause: null });
    },
  },
};

/**
 * The relay as it stands after carrying `perUnit` × its setting long enough to settle: the image
 * at its steady state θ = perUnit². At 1 this is the "hot" state from which IEC 60947-4-1 times
 * its overload tests; 0 is cold. Trip latch and its cause are kept: heat does not reset a relay.
 */
export function preheatedState(state: OverloadState, perUnit: number): OverloadState {
  const theta = perUnit * perUnit;
  return { ...state, theta, baseTheta: theta, sinceMs: 0, overMs: 0 };
}
