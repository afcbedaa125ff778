/**
 * Each standard lab's safety properties: proved for the reference solution, refuted for a typical
 * wrong answer, and the counterexample, run through the command line's `check`, exits 0 (the
 * violation reproduces on the simulator).
 */
import { describe, expect, it } from 'vitest';
import { REVERSING_CONVEYOR } from '@shared/field';
import { standardLab, STANDARD_LABS } from '@shared/labs';
import { prove, type Property } from '@shared/proof';
import type { CliIO } from '../../../server/cli/io';
import { cliMain } from '../../../server/cli/main';
import { MISTAKES } from '../labs/mistakes';

// The lamps are left out: a red "stopped" lamp on an NC auxiliary contact is lit in the program
// during an e-stop (its circuit is dead all the same, the output common being open).
const ESTOP: Property = {
  always: { '%QX1': false, '%QX2': false, '%QX3': false },
  when: { S0: 'pressed' },
  label: 'while the e-stop is pressed no contactor and no horn is commanded',
};
const STOP_DOMINATES: Property = { always: { '%QX1': false }, when: { S1: 'pressed' }, label: 'stop dominates start' };
// %IX7 is K1's auxiliary contact as the program reads it: once it shows K1 dropped, the command
// must be off (else the belt restarts by itself when F1 is reset).
const TRIP_ENDS_RUN: Property = {
  always: { '%QX1': false },
  when: { F1: 'tripped', S2: 'released', '%IX7': false },
  label: 'once an overload trip has dropped K1, the run command is off until S2 is pressed again',
};

interface LabCase {
  lab: string;
  properties: Property[];
  /** A typical wrong answer (tests/unit/labs/mistakes.ts) and the label of the property it breaks. */
  mistake: string;
  refutes: string;
}

const CASES: LabCase[] = [
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

/** Run the command line's `check` on a program and a script held in memory. */
function checkExit(program: unknown, script: unknown): { code: number; out: string } {
  const files: Record<string, string> = { 'p.json': JSON.stringify(program), 's.json': JSON.stringify(script) };
  const out: string[] = [];
  const io: CliIO = {
    readFile: (p) => (Object.hasOwn(files, p) ? { ok: true, value: files[p]! } : { ok: false, error: `${p}: no such file` }),
    writeFile: () => ({ ok: true, value: undefined }),
    stdout: (t) => void out.push(t),
    stderr: (t) => void out.push(t),
  };
  const code = cliMain(['check', '--program', 'p.json', '--script', 's.json'], io);
  return { code, out: out.join('') };
}

describe('the standard labs under proof', () => {
  it('covers every standard lab', () => {
    expect(new Set(CASES.map((c) => c.lab))).toEqual(new Set(STANDARD_LABS.map((l) => l.id)));
  });

  it.each(CASES.map((c) => [c.lab, c.mistake, c] as const))('%s: the reference proves its safety properties; "%s" is refuted', (_lab, _mistake, c) => {
    const lab = standardLab(c.lab)!;
    const reference = prove({ program: lab.solution, panel: REVERSING_CONVEYOR, properties: c.properties });
    if (!reference.ok) throw new Error(reference.errors.join('\n'));
    expect(reference.results.map((r) => [r.label, r.verdict])).toEqual(c.properties.map((_, i) => [reference.results[i]!.label, 'proved']));

    const mistake = MISTAKES.find((m) => m.lab === c.lab && m.name === c.mistake)!;
    const wrong = prove({ program: mistake.program, panel: REVERSING_CONVEYOR, properties: c.properties });
    if (!wrong.ok) throw new Error(wrong.errors.join('\n'));
    const refuted = wrong.results.find((r) => r.label === c.refutes)!;
    expect(refuted.verdict).toBe('refuted');
    expect(refuted.defect).toBeUndefined();
    // The counterexample reproduces through the ordinary command line: every step passes.
    const run = checkExit(mistake.program, refuted.counterexample);
    expect(run.code, run.out).toBe(0);
    // …and the same script fails on the reference solution: it catches exactly the wrong answer.
    expect(checkExit(lab.solution, refuted.counterexample).code).toBe(1);
  });
});
