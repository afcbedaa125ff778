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

export const overload: DeviceModel<OverloadParams, OverloadState> = {
  kind: 'overload',
  noun: 'an overload relay',
  params: OverloadParamsSchema,
  contacts: () => CONTACTS,
  initial: (params) => ({ theta: 0, tripped: false, cause: null, overMs: 0, currentA: 0, tauS: tauOf(params) }),
  isClosed: (state, _params, contact) => (contact === '95-96' ? !state.tripped : state.tripped),
  word: (state) => (state.tripped ? 'tripped' : 'ok'),
  words: () => ['ok', 'tripped'],
  step(state, params, inputs, dtMs) {
    const current = inputs.currentA;
    if (current === 0 && state.theta === 0 && state.currentA === 0 && state.overMs === 0) return state;
    const perUnit = current / params.settingA;
    let theta = advanceImage(state.theta, perUnit, dtMs, state.tauS);
    if (current === 0 && theta < COLD_EPSILON) theta = 0;
    const overMs = perUnit > 1 ? state.overMs + dtMs : 0;
    const k2 = params.tripFactor * params.tripFactor;
    const tripsNow = !state.tripped && theta >= k2;
    return {
      theta,
      tripped: state.tripped || tripsNow,
      cause: tripsNow ? 'thermal' : state.cause,
      overMs,
      currentA: current,
      tauS: state.tauS,
    };
  },
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
  return { ...state, theta: perUnit * perUnit, overMs: 0 };
}
