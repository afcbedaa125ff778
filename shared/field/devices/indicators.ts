/**
 * Loads with no memory: an indicator lamp is lit and a horn sounds exactly while its circuit is
 * energised (output ON, output common live, series contacts closed).
 */
import { z } from 'zod';
import { ColourSchema } from './colours';
import type { DeviceModel } from './model';

export const LampParamsSchema = z.object({ colour: ColourSchema.default('white') });
export type LampParams = z.infer<typeof LampParamsSchema>;
export const HornParamsSchema = z.object({});
export type HornParams = z.infer<typeof HornParamsSchema>;

/** Lamps and horns share one state: powered or not. */
export interface IndicatorState {
  readonly on: boolean;
}

const OFF: IndicatorState = Object.freeze({ on: false });
const ON: IndicatorState = Object.freeze({ on: true });

export const lamp: DeviceModel<LampParams, IndicatorState> = {
  kind: 'lamp',
  noun: 'a lamp',
  params: LampParamsSchema,
  contacts: () => [],
  initial: () => OFF,
  isClosed: () => false,
  word: (state) => (state.on ? 'lit' : 'dark'),
  words: () => ['lit', 'dark'],
  load: true,
  step: (state, _params, inputs) => (inputs.energised === state.on ? state : inputs.energised ? ON : OFF),
  actions: {},
};

export const horn: DeviceModel<HornParams, IndicatorState> = {
  kind: 'horn',
  noun: 'a horn',
  params: HornParamsSchema,
  contacts: () => [],
  initial: () => OFF,
  isClosed: () => false,
  word: (state) => (state.on ? 'sounding' : 'silent'),
  words: () => ['sounding', 'silent'],
  load: true,
  step: (state, _params, inputs) => (inputs.energised === state.on ? state : inputs.energised ? ON : OFF),
  actions: {},
};
