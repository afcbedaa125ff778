/**
 * Three-phase induction motor, simplified for control practice. Speed is signed (+1 full speed
 * forward, −1 full speed reverse) and ramps linearly toward the supply's direction; without supply
 * it coasts to rest. Current: while the motor accelerates toward its supplied direction — starting,
 * or reversed while still turning ("plugging") — it draws the starting multiple of FLA (about 6 ×,
 * common practice for induction motors); at speed it draws load factor × FLA. A load factor of 6 or
 * more stands for a jammed belt.
 */
import { z } from 'zod';
import { done, refused, type DeviceModel, type Supply } from './model';

/** A contactor whose main contacts feed the motor, and the direction that connection turns it. */
export const MotorFeederSchema = z.object({
  contactor: z.string(),
  direction: z.enum(['forward', 'reverse']),
});
export type MotorFeeder = z.infer<typeof MotorFeederSchema>;

export const MotorParamsSchema = z.object({
  /** Full-load current in A (NEC Table 430.250 for a given hp and voltage, or the nameplate). */
  flaA: z.number().positive().max(10_000),
  /** Nameplate horsepower and line voltage, for display only. */
  hp: z.number().positive().optional(),
  volts: z.number().positive().optional(),
  /** Standstill to full speed, in ms (our model value for a small belt drive). */
  rampMs: z.number().min(1).max(60_000).default(500),
  /** Full speed to rest without supply, in ms (our model value). */
  coastMs: z.number().min(1).max(600_000).default(800),
  /** Current while accelerating, as a multiple of FLA. */
  startMultiple: z.number().min(1).max(12).default(6),
  feeders: z.array(MotorFeederSchema).max(4).default([]),
});
export type MotorParams = z.infer<typeof MotorParamsSchema>;

export interface MotorState {
  /** Signed fraction of rated speed: +1 forward, −1 reverse, 0 at rest. */
  readonly speed: number;
  readonly currentA: number;
  /** Mechanical load as a multiple of FLA at full speed (1 = rated load). */
  readonly loadFactor: number;
  readonly supply: Supply;
}

const REST: MotorState = Object.freeze({ speed: 0, currentA: 0, loadFactor: 1, supply: 'none' });

/** Moves `value` toward `target` by at most `delta`. */
function approach(value: number, target: number, delta: number): number {
  if (value < target) return Math.min(target, value + delta);
  if (value > target) return Math.max(target, value - delta);
  return value;
}

/** `forward`, `reverse` or `stopped`, by the way the shaft is actually turning. */
export function motorDirection(state: MotorState): 'stopped' | 'forward' | 'reverse' {
  return state.speed > 0 ? 'forward' : state.speed < 0 ? 'reverse' : 'stopped';
}

export const motor: DeviceModel<MotorParams, MotorState> = {
  kind: 'motor',
  noun: 'a motor',
  params: MotorParamsSchema,
  contacts: () => [],
  initial: () => REST,
  isClosed: () => false,
  word: (state) => motorDirection(state),
  words: () => ['stopped', 'forward', 'reverse'],
  gathers: 'supply',
  links: (params) =>
    params.feeders.map((f, i) => ({ role: 'fedBy' as const, device: f.contactor, kind: 'contactor' as const, path: `feeders[${i}].contactor`, direction: f.direction })),
  step(state, params, inputs, dtMs) {
    const supply = inputs.supply;
    if (supply === 'none' && state.speed === 0 && state.currentA === 0) {
      return state.supply === 'none' ? state : { ...state, supply };
    }
    const target = supply === 'forward' ? 1 : supply === 'reverse' ? -1 : 0;
    const rate = supply === 'none' ? dtMs / params.coastMs : dtMs / params.rampMs;
    const speed = approach(state.speed, target, rate);
    let currentA = 0;
    if (supply !== 'none') {
      const atSpeed = speed === target;
      const multiple = atSpeed ? state.loadFactor : Math.max(params.startMultiple, state.loadFactor);
      currentA = multiple * params.flaA;
    }
    if (speed === state.speed && currentA === state.currentA && supply === state.supply) return state;
    return { speed, currentA, loadFactor: state.loadFactor, supply };
  },
  actions: {
    load(state, _params, args) {
      const factor = args.factor;
      if (factor === undefined || !Number.isFinite(factor) || factor < 0 || factor > 20) {
        return refused(`a load factor is a multiple of FLA from 0 to 20, got ${String(factor)}`);
      }
      return done({ ...state, loadFactor: factor });
    },
  },
};
