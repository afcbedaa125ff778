/**
 * Latching emergency stop (mushroom head, red on yellow; ISO 13850:2015): pressing latches it and
 * opens its NC contacts; it stays open until released (twisted / pulled) by hand, and releasing it
 * only closes the contacts again — it must not restart anything by itself (that is the program's
 * and the wiring's job). Two NC blocks, 11-12 and 21-22, so the input and output commons can each
 * run through their own contact (common practice).
 */
import { z } from 'zod';
import { done, type ContactSpec, type DeviceModel } from './model';

export const EstopParamsSchema = z.object({});
export type EstopParams = z.infer<typeof EstopParamsSchema>;

export interface EstopState {
  /** Pressed and latched: the NC contacts are open. */
  readonly latched: boolean;
}

const CONTACTS: readonly ContactSpec[] = [
  { name: '11-12', form: 'NC' },
  { name: '21-22', form: 'NC' },
];
const RELEASED: EstopState = Object.freeze({ latched: false });
const LATCHED: EstopState = Object.freeze({ latched: true });

export const estop: DeviceModel<EstopParams, EstopState> = {
  kind: 'estop',
  noun: 'an emergency stop',
  params: EstopParamsSchema,
  contacts: () => CONTACTS,
  initial: () => RELEASED,
  isClosed: (state) => !state.latched,
  word: (state) => (state.latched ? 'pressed' : 'released'),
  words: () => ['pressed', 'released'],
  actions: {
    press: () => done(LATCHED),
    release: () => done(RELEASED),
    reset: () => done(RELEASED),
  },
};
