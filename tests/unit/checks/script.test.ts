import { describe, expect, it } from 'vitest';
import { CheckScriptSchema, checkScriptAgainstPanel, kindsFor, parseCheckScript, type CheckScript } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { STANDARD_LABS } from '@shared/labs';

const errorsOf = (json: unknown): string[] => {
  const r = parseCheckScript(json);
  return r.ok ? [] : r.errors;
};
/** A script of `steps`, ended by a check (a script without one is refused). */
const script = (...steps: unknown[]) => ({ panel: 'reversing-conveyor', steps: [...steps, { expect: { K1: 'open' } }] });
const fit = (json: unknown): string[] => {
  const r = parseCheckScript(json);
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return checkScriptAgainstPanel(r.value, REVERSING_CONVEYOR);
};

describe('parseCheckScript', () => {
  it('accepts the example of docs/check-scripts.md and fills in the defaults', () => {
    const r = parseCheckScript({
      panel: 'reversing-conveyor',
      scanMs: 10,
      steps: [
        { expect: { P2: 'lit', '%QX5': true }, label: 'red lamp on at rest', points: 1 },
        { set: 'S4', to: 'RUN' },
        { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 100 },
        { expect: { K1: 'closed', M1: 'forward' }, label: 'runs forward, sealed in', points: 2 },
        { trip: 'F1' }, { wait: 50 },
        { expect: { K1: 'open', '%IX7': false }, label: 'overload drops K1', hidden: true },
      ],
    });
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value.settleMs).toBe(100);
  });
  it('accepts every action of the format', () => {
    const r = parseCheckScript(script(
      { press: 'S2' }, { release: 'S2' }, { set: 'S4', to: 'RUN' }, { trip: 'F1' }, { reset: 'F1' },
      { load: 'M1', factor: 6 }, { block: 'B1' }, { unblock: 'B1' }, { wait: 0 },
      { expect: { 'T1.ET': 2500, 'C1.CV': { min: 1, max: 3 }, K1: 'open', '%MX1': false } },
    ));
    expect(r.ok).toBe(true);
  });
  it('agrees with the zod schema on every lab script', () => {
    for (const lab of STANDARD_LABS) {
      expect(parseCheckScript(lab.script).ok).toBe(true);
      expect(CheckScriptSchema.safeParse(lab.script).success).toBe(true);
    }
  });
  it('names the step, the field and what was expected', () => {
    expect(errorsOf(script({ press: 'S2' }, { wait: 'abc' }))).toEqual(['step 2: "wait" needs a whole number of ms from 0 to 14400000, got "abc"']);
    expect(errorsOf(script({ wait: 1.5 }))).toEqual(['step 1: "wait" needs a whole number of ms from 0 to 14400000, got 1.5']);
    expect(errorsOf(script({ set: 'S4' }))).toEqual(['step 1: "set" needs "to": the position name, e.g. "RUN"; got nothing']);
    expect(errorsOf(script({ load: 'M1', factor: 50 }))).toEqual(['step 1: "load" needs "factor": the load as a multiple of FLA from 0 to 20 (6 ≈ jammed); got 50']);
    expect(errorsOf(script({ press: 3 }))).toEqual(['step 1: "press" needs a device id such as "S2", got 3']);
    expect(errorsOf(script({ presss: 'S2' }))[0]).toBe('step 1: no action; a step has one of press, release, set, trip, reset, load, block, unblock, wait, expect, during, until, force, unforce, preheat, prove, power');
    expect(errorsOf(script({ press: 'S2', wait: 10 }))).toEqual(['step 1: one action per step, got "press" and "wait"']);
    expect(errorsOf(script({ expect: { K1: 'open' }, lable: 'x' }))).toEqual(['step 1: unknown field "lable" (an "expect" step also takes label, points, hidden)']);
    expect(errorsOf(script({ expect: {} }))[0]).toMatch(/^step 1: "expect" needs an object of what to check/);
    expect(errorsOf(script({ expect: { K1: null } }))[0]).toMatch(/^step 1: expect "K1" takes true\/false, a number, a state word/);
    expect(errorsOf(script({ expect: { K1: 'open' }, points: -1, hidden: 'yes' }))).toEqual([
      'step 1: "points" is a whole number from 0 to 100, got -1',
      'step 1: "hidden" is true or false, got "yes"',
    ]);
  });
  it('names problems of the script as a whole', () => {
    expect(errorsOf([])).toEqual(['a check script is a JSON object with "steps"']);
    expect(errorsOf({ steps: [] })).toEqual(['"steps" needs a list of at least one step, got []']);
    expect(errorsOf({ scanMs: 0, steps: [{ wait: 1 }], extra: 1 })).toEqual([
      'unknown field "extra" (a script has panel, scanMs, settleMs, title, steps)',
      '"scanMs" is a whole number of ms from 1 to 1000, got 0',
    ]);
  });
});

describe('checkScriptAgainstPanel', () => {
  it('names a device that cannot take the action, with its kind', () => {
    expect(fit(script({ press: 'S2' }, { wait: 10 }, { trip: 'K1' }))).toEqual(['step 3: "trip" needs the id of an overload relay, got "K1" (a contactor)']);
    expect(fit(script({ set: 'S2', to: 'RUN' }))).toEqual(['step 1: "set" needs the id of a selector switch, got "S2" (a pushbutton)']);
    expect(fit(script({ load: 'K1', factor: 2 }))).toEqual(['step 1: "load" needs the id of a motor, got "K1" (a contactor)']);
    expect(fit(script({ press: 'K1' }))).toEqual(['step 1: "press" needs the id of a pushbutton, an emergency stop or a limit switch, got "K1" (a contactor)']);
  });
  it('names a device that is not on the panel and a position that does not exist', () => {
    expect(fit(script({ block: 'B7' }))).toEqual(['step 1: "block" needs the id of a photo-eye or a limit switch, got "B7", which is not on panel reversing-conveyor']);
    expect(fit(script({ set: 'S4', to: 'AUTO' }))).toEqual(['step 1: "to": S4 has positions JOG, RUN, got "AUTO"']);
  });
  it('checks what an expect names and the type of value it expects', () => {
    expect(fit(script({ expect: { K1: 'lit' } }))).toEqual(['step 1: "K1" is a contactor: expect "open" or "closed", got "lit"']);
    expect(fit(script({ expect: { M1: true } }))).toEqual(['step 1: "M1" is a motor: expect "stopped", "forward" or "reverse", got true']);
    expect(fit(script({ expect: { '%QX5': 'lit' } }))).toEqual(['step 1: "%QX5" is a bit: expect true or false, got "lit"']);
    expect(fit(script({ expect: { '%QX7': true } }))).toEqual(['step 1: %QX7 is out of range: this panel has outputs %QX1..%QX6']);
    expect(fit(script({ expect: { 'T1.ET': 'long' } }))).toEqual(['step 1: "T1.ET" is a block value: expect true/false, a number or a range, got "long"']);
    expect(fit(script({ expect: { Z9: 'open' } }))[0]).toMatch(/^step 1: "Z9" is not a device on panel reversing-conveyor; as a tag it is a bit/);
    expect(fit(script({ expect: { 'K1_Aux': true, 'T1.Q': true, 'C1.CV': { min: 2 } } }))).toEqual([]);
  });
  it('refuses a script written for another panel', () => {
    expect(fit({ panel: 'mixer', steps: [{ expect: { K1: 'open' } }] })).toEqual(['the script is written for panel "mixer", but the panel given is "reversing-conveyor"']);
  });
  it('knows which kinds take each action', () => {
    expect(kindsFor('trip')).toEqual(['overload']);
    expect(kindsFor('reset')).toEqual(['estop', 'overload']);
  });
  it('accepts a parsed script typed as CheckScript', () => {
    const parsed = parseCheckScript(STANDARD_LABS[0]!.script);
    expect(parsed.ok && checkScriptAgainstPanel(parsed.value as CheckScript, REVERSING_CONVEYOR)).toEqual([]);
  });
});

describe('the power step', () => {
  it('takes "off" or "on" and names anything else', () => {
    expect(errorsOf(script({ power: 'off' }, { power: 'on' }, { expect: { K1: 'open' } }))).toEqual([]);
    expect(errorsOf(script({ power: 'down' }, { expect: { K1: 'open' } }))).toEqual(['step 1: "power" is "off" (the controller loses power) or "on" (a warm restart), got "down"']);
  });
});
