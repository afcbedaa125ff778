/**
 * Each standard lab's safety properties (plain words in their labels), with a typical wrong answer
 * (tests/unit/labs/mistakes.ts) that breaks one of them. Shared by the proof tests and the
 * `proof` benchmark.
 */
import type { Property } from '@shared/proof';

// The lamps are left out: a red "stopped" lamp on an NC auxiliary contact is lit in the program
// during an e-stop (its circuit is dead all the same, the output common being open).
export const ESTOP: Property = {
  always: { '%QX1': false, '%QX2': false, '%QX3': false },
  when: { S0: 'pressed' },
  label: 'while the e-stop is pressed no contactor and no horn is commanded',
};
export const STOP_DOMINATES: Property = { always: { '%QX1': false }, when: { S1: 'pressed' }, label: 'stop dominates start' };
// %IX7 is K1's auxiliary contact as the program reads it: once it shows K1 dropped, the command
// must be off (else the belt restarts by itself when F1 is reset).
export const TRIP_ENDS_RUN: Property = {
  always: { '%QX1': false },
  when: { F1: 'tripped', S2: 'released', '%IX7': false },
  label: 'once an overload trip has dropped K1, the run command is off until S2 is pressed again',
};

export interface LabCase {
  lab: string;
  properties: Property[];
  /** A typical wrong answer (tests/unit/labs/mistakes.ts) and the label of the property it breaks. */
  mistake: string;
  refutes: string;
}

export const LAB_CASES: LabCase[] = [
  {
    lab: 'io-checkout',
    properties: [ESTOP, { always: { H1: 'silent' }, when: { S3: 'released' }, label: 'the horn sounds only while S3 is pressed' }],
    mistake: 'horn and amber lamp swapped',
    refutes: 'the horn sounds only while S3 is pressed',
  },
  {
    lab: 'io-checkout',
    properties: [ESTOP, { always: { P2: 'lit' }, when: { S0: 'released', S1: 'released' }, label: 'the red lamp is lit while S1 is not pressed' }],
    mistake: 'stop button examined with an NC contact',
    refutes: 'the red lamp is lit while S1 is not pressed',
  },
  {
    lab: 'two-wire',
    properties: [ESTOP, STOP_DOMINATES, { always: { '%QX1': false }, when: { S4: 'JOG' }, label: 'the belt runs only with the selector at RUN' }],
    mistake: 'started from the momentary forward button',
    refutes: 'the belt runs only with the selector at RUN',
  },
  {
    lab: 'three-wire',
    properties: [ESTOP, STOP_DOMINATES, TRIP_ENDS_RUN],
    mistake: 'seal-in on the output bit instead of the auxiliary contact',
    refutes: TRIP_ENDS_RUN.label!,
  },
  {
    lab: 'jog-run',
    properties: [
      ESTOP,
      STOP_DOMINATES,
      { after: { S2: 'released', S4: 'JOG' }, within: 20, expect: { '%QX1': false }, label: 'at JOG the belt stops as soon as S2 is released' },
    ],
    mistake: 'seal-in regardless of the selector',
    refutes: 'at JOG the belt stops as soon as S2 is released',
  },
  {
    lab: 'forward-reverse',
    properties: [ESTOP, { never: { '%QX1': true, '%QX2': true }, label: 'K1 and K2 are never commanded together' }, { never: { K1: 'closed', K2: 'closed' } }],
    mistake: 'interlocked on the auxiliary contacts only (both buttons at once command both coils)',
    refutes: 'K1 and K2 are never commanded together',
  },
  {
    lab: 'forward-reverse',
    properties: [TRIP_ENDS_RUN],
    mistake: 'seal-ins on the output bits instead of the auxiliary contacts',
    refutes: TRIP_ENDS_RUN.label!,
  },
  {
    lab: 'warning-horn',
    properties: [ESTOP, STOP_DOMINATES, { after: { H1: 'sounding' }, within: 3000, expect: { H1: 'silent' }, label: 'the horn stops within 3 s' }],
    mistake: 'horn keeps sounding while the belt runs',
    refutes: 'the horn stops within 3 s',
  },
  {
    lab: 'box-counter',
    properties: [ESTOP, STOP_DOMINATES, { after: { S2: 'pressed' }, within: 20, expect: { P3: 'dark' }, label: 'S2 starts a new batch' }],
    mistake: 'counter never reset',
    refutes: 'S2 starts a new batch',
  },
];
