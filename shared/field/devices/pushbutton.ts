/**
 * Momentary pushbutton: pressed while held, springs back on release. One contact block, NO
 * (terminals 13-14) or NC (11-12), marked per IEC 60947-5-1 terminal numbering (common practice).
 */
import { z } from 'zod';
import { ColourSchema } from './colours';
import { done, type ContactSpec, type DeviceModel } from './model';

export const PushbuttonParamsSchema = z.object({
  /** The contact block fitted: NO closes when pressed, NC opens when pressed. */
  form: z.enum(['NO', 'NC']).default('NO'),
  colour: ColourSchema.default('black'),
});
export type PushbuttonParams = z.infer<typeof PushbuttonParamsSchema>;

export interface PushbuttonState {
  readonly pressed: boolean;
}

const NO_CONTACT: readonly ContactSpec[] = [{ name: '13-14', form: 'NO' }];
const NC_CONTACT: readonly ContactSpec[] = [{ name: '11-12', form: 'NC' }];
const RELEASED: PushbuttonState = Object.freeze({ pressed: false });
const PRESSED: PushbuttonState = Object.freeze({ pressed: true });

export const pushbutton: DeviceModel<PushbuttonParams, PushbuttonState> = {
  kind: 'pushbutton',
  noun: 'a pushbutton',
  params: PushbuttonParamsSchema,
  contacts: (params) => (params.form === 'NO' ? NO_CONTACT : NC_CONTACT),
  initial: () => RELEASED,
  isClosed: (state, params) => (params.form === 'NO' ? state.pressed : !state.pressed),
  word: (state) => (state.pressed ? 'pressed' : 'released'),
  words: () => ['pressed', 'released'],
  actions: {
    press: () => done(PRESSED),
    release: () => done(RELEASED),
  },
};
