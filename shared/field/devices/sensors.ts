/**
 * Field sensors moved by the machine (here: by the student or a check script). A photo-eye sees a
 * box break its beam; a limit switch is actuated by a cam or a box pushing its lever.
 */
import { z } from 'zod';
import { done, type ContactSpec, type DeviceModel } from './model';

export const PhotoeyeParamsSchema = z.object({
  /** Light- or dark-operated output: `blocked` = the output closes while a box breaks the beam. */
  closesWhen: z.enum(['blocked', 'clear']).default('blocked'),
});
export type PhotoeyeParams = z.infer<typeof PhotoeyeParamsSchema>;

export interface PhotoeyeState {
  readonly blocked: boolean;
}

const CLEAR: PhotoeyeState = Object.freeze({ blocked: false });
const BLOCKED: PhotoeyeState = Object.freeze({ blocked: true });

export const photoeye: DeviceModel<PhotoeyeParams, PhotoeyeState> = {
  kind: 'photoeye',
  noun: 'a photo-eye',
  params: PhotoeyeParamsSchema,
  contacts: (params) => [{ name: 'OUT', form: params.closesWhen === 'blocked' ? 'NO' : 'NC' }],
  initial: () => CLEAR,
  isClosed: (state, params) => (params.closesWhen === 'blocked' ? state.blocked : !state.blocked),
  word: (state) => (state.blocked ? 'blocked' : 'clear'),
  words: () => ['blocked', 'clear'],
  actions: {
    block: () => done(BLOCKED),
    unblock: () => done(CLEAR),
  },
};

export const LimitParamsSchema = z.object({});
export type LimitParams = z.infer<typeof LimitParamsSchema>;

export interface LimitState {
  readonly actuated: boolean;
}

/** A limit switch body usually carries one NO and one NC block (common practice). */
const LIMIT_CONTACTS: readonly ContactSpec[] = [
  { name: '13-14', form: 'NO' },
  { name: '21-22', form: 'NC' },
];
const RESTING: LimitState = Object.freeze({ actuated: false });
const ACTUATED: LimitState = Object.freeze({ actuated: true });

export const limit: DeviceModel<LimitParams, LimitState> = {
  kind: 'limit',
  noun: 'a limit switch',
  params: LimitParamsSchema,
  contacts: () => LIMIT_CONTACTS,
  initial: () => RESTING,
  isClosed: (state, _params, contact) => (contact === '13-14' ? state.actuated : !state.actuated),
  word: (state) => (state.actuated ? 'actuated' : 'released'),
  words: () => ['actuated', 'released'],
  actions: {
    press: () => done(ACTUATED),
    release: () => done(RESTING),
    block: () => done(ACTUATED),
    unblock: () => done(RESTING),
  },
};
