/**
 * Mechanical interlock between two contactors (the reversing pair): a lever that lets only one
 * carrier pull in. Rule of this simulator (docs/names-and-rules.md): once one carrier is engaged (picking up,
 * closed, or still dropping out) the other is held open; if both coils are energised in the same
 * step while both carriers are at rest, neither closes and the panel reports an interlock conflict.
 */
import { z } from 'zod';
import type { DeviceModel } from './model';

export const InterlockParamsSchema = z.object({
  /** The two contactors it couples, by device id. */
  contactors: z.tuple([z.string(), z.string()]),
});
export type InterlockParams = z.infer<typeof InterlockParamsSchema>;

export interface InterlockState {
  /** Both coils energised while both carriers were open: neither may close. */
  readonly conflict: boolean;
}

/** Which carriers the lever holds open this step, and whether that is a conflict. */
export interface InterlockVerdict {
  blockA: boolean;
  blockB: boolean;
  conflict: boolean;
}

const CONFLICT_VERDICT: InterlockVerdict = Object.freeze({ blockA: true, blockB: true, conflict: true });
const VERDICTS: readonly InterlockVerdict[] = [
  Object.freeze({ blockA: false, blockB: false, conflict: false }),
  Object.freeze({ blockA: false, blockB: true, conflict: false }),
  Object.freeze({ blockA: true, blockB: false, conflict: false }),
  Object.freeze({ blockA: true, blockB: true, conflict: false }),
];

/**
 * The interlock rule, as a pure function of both sides: whether each coil has power this step and
 * whether each carrier is engaged (picking up, closed or dropping out). Returns shared frozen
 * verdicts, so the scan loop allocates nothing.
 */
export function interlockRule(coilA: boolean, engagedA: boolean, coilB: boolean, engagedB: boolean): InterlockVerdict {
  if (!engagedA && !engagedB && coilA && coilB) return CONFLICT_VERDICT;
  return VERDICTS[(engagedB ? 2 : 0) + (engagedA ? 1 : 0)]!;
}

const CLEAR: InterlockState = Object.freeze({ conflict: false });
const CONFLICT: InterlockState = Object.freeze({ conflict: true });

export const interlock: DeviceModel<InterlockParams, InterlockState> = {
  kind: 'interlock',
  noun: 'a mechanical interlock',
  params: InterlockParamsSchema,
  contacts: () => [],
  initial: () => CLEAR,
  isClosed: () => false,
  word: (state) => (state.conflict ? 'conflict' : 'clear'),
  words: () => ['clear', 'conflict'],
  step: (state, _params, inputs) => (inputs.conflict === state.conflict ? state : inputs.conflict ? CONFLICT : CLEAR),
  actions: {},
  links: (params) => params.contactors.map((device, i) => ({ role: 'interlocks' as const, device, kind: 'contactor' as const, path: `contactors[${i}]` })),
  checkLinks: (params) => (params.contactors[0] === params.contactors[1] ? ['contactors: an interlock couples two different contactors'] : []),
};
