/**
 * Contactor: a coil that pulls in a carrier holding the main contacts (to the motor) and the
 * auxiliary contacts (13-14 NO, 21-22 NC) that follow it. The carrier moves only after the coil
 * has been energised for the pick-up delay, or de-energised for the drop-out delay (both in ms).
 * A mechanical interlock can hold the carrier open (`inputs.blocked`).
 */
import { z } from 'zod';
import type { ContactSpec, DeviceModel } from './model';

export const ContactorParamsSchema = z.object({
  /** Coil energised → main contacts closed, in ms. 25 ms is typical of small contactors (from memory). */
  pickUpMs: z.number().min(0).max(1000).default(25),
  /** Coil de-energised → main contacts open, in ms. 15 ms is typical (from memory). */
  dropOutMs: z.number().min(0).max(1000).default(15),
});
export type ContactorParams = z.infer<typeof ContactorParamsSchema>;

export interface ContactorState {
  /** Carrier pulled in: main contacts and 13-14 closed, 21-22 open. */
  readonly closed: boolean;
  /** How long the coil has disagreed with the carrier, in ms; 0 when they agree. */
  readonly movingMs: number;
  /** The coil is energised but a mechanical interlock keeps the carrier open. */
  readonly held: boolean;
}

const CONTACTS: readonly ContactSpec[] = [
  { name: '13-14', form: 'NO' },
  { name: '21-22', form: 'NC' },
];
const OPEN: ContactorState = Object.freeze({ closed: false, movingMs: 0, held: false });
const CLOSED: ContactorState = Object.freeze({ closed: true, movingMs: 0, held: false });

/** Picking up or dropping out: the carrier is on its way. A mechanical interlock treats it as engaged. */
export function isEngaged(state: ContactorState): boolean {
  return state.closed || state.movingMs > 0;
}

export const contactor: DeviceModel<ContactorParams, ContactorState> = {
  kind: 'contactor',
  noun: 'a contactor',
  params: ContactorParamsSchema,
  contacts: () => CONTACTS,
  initial: () => OPEN,
  isClosed: (state, _params, contact) => (contact === '13-14' ? state.closed : !state.closed),
  word: (state) => (state.closed ? 'closed' : 'open'),
  words: () => ['open', 'closed'],
  load: true,
  explainLoad(state, energised) {
    if (state.held) return 'held by the mechanical interlock';
    if (energised && !state.closed) return 'picking up';
    if (!energised && state.closed) return 'dropping out';
    return '';
  },
  step(state, params, inputs, dtMs) {
    const held = inputs.energised && inputs.blocked && !state.closed;
    const wantClosed = inputs.energised && !held;
    if (wantClosed === state.closed) {
      if (state.movingMs === 0 && state.held === held) return state;
      return state.closed ? CLOSED : held ? { closed: false, movingMs: 0, held } : OPEN;
    }
    const movingMs = state.movingMs + dtMs;
    const delay = wantClosed ? params.pickUpMs : params.dropOutMs;
    if (movingMs >= delay) return wantClosed ? CLOSED : OPEN;
    return { closed: state.closed, movingMs, held };
  },
  actions: {},
};
