/**
 * Maintained selector switch: stays where it is turned. One NO contact per position, named after
 * the position, closed only while the switch is there (so a 2-position JOG/RUN switch wired on its
 * `RUN` contact reads open at JOG).
 */
import { z } from 'zod';
import { done, refused, type DeviceModel } from './model';

export const SelectorParamsSchema = z
  .object({
    positions: z
      .array(z.string().regex(/^[A-Za-z0-9_]{1,16}$/, 'a position name is 1-16 letters, digits or "_"'))
      .min(2, 'a selector has at least 2 positions')
      .max(4, 'a selector has at most 4 positions'),
    /** Where it sits when the panel is powered up; the first position if omitted. */
    initial: z.string().optional(),
  })
  .refine((p) => new Set(p.positions).size === p.positions.length, {
    message: 'selector positions must have different names',
    path: ['positions'],
  })
  .refine((p) => p.initial === undefined || p.positions.includes(p.initial), {
    message: 'the initial position must be one of the positions',
    path: ['initial'],
  });
export type SelectorParams = z.infer<typeof SelectorParamsSchema>;

export interface SelectorState {
  readonly position: string;
}

export const selector: DeviceModel<SelectorParams, SelectorState> = {
  kind: 'selector',
  noun: 'a selector switch',
  params: SelectorParamsSchema,
  contacts: (params) => params.positions.map((name) => ({ name, form: 'NO' as const })),
  initial: (params) => ({ position: params.initial ?? params.positions[0]! }),
  isClosed: (state, _params, contact) => state.position === contact,
  word: (state) => state.position,
  words: (params) => params.positions,
  actions: {
    set: (state, params, args) => {
      const to = args.to ?? '';
      if (!params.positions.includes(to)) {
        return refused(`position "${to}" does not exist; it has ${params.positions.join(', ')}`);
      }
      return to === state.position ? done(state) : done({ position: to });
    },
  },
};
