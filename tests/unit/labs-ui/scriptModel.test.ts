import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { REVERSING_CONVEYOR } from '@shared/field';
import { STANDARD_LABS, THREE_WIRE } from '@shared/labs';
import { STEP_ACTIONS, type StepAction } from '@shared/checks';
import {
  changeAction,
  describeDraftStep,
  devicesFor,
  draftAction,
  expectTargets,
  insertStep,
  moveStep,
  newStep,
  parseScriptJson,
  removeStep,
  scriptToJson,
  setCheckField,
  setExpectation,
  totalPoints,
  validateScript,
  type DraftScript,
  type DraftStep,
} from '@/components/labs/scriptModel';

const panel = REVERSING_CONVEYOR;

describe('the check-script editor model', () => {
  it('offers for each action only the devices that can take it', () => {
    expect(devicesFor('trip', panel).map((d) => d.id)).toEqual(['F1']);
    expect(devicesFor('set', panel).map((d) => d.id)).toEqual(['S4']);
    expect(devicesFor('block', panel).map((d) => d.id)).toEqual(['B1']);
    expect(devicesFor('press', panel).map((d) => d.id)).toEqual(expect.arrayContaining(['S0', 'S1', 'S2', 'S3']));
    expect(devicesFor('press', panel).map((d) => d.id)).not.toContain('K1');
    expect(devicesFor('wait', panel)).toEqual([]);
  });

  it('offers expectations from the panel: device state words and every input and output bit', () => {
    const targets = expectTargets(panel);
    const k1 = targets.find((t) => t.key === 'K1');
    expect(k1?.values).toEqual(expect.arrayContaining(['open', 'closed']));
    expect(targets.find((t) => t.key === 'M1')?.values).toEqual(expect.arrayContaining(['stopped', 'forward', 'reverse']));
    expect(targets.find((t) => t.key === '%IX7')).toMatchObject({ label: '%IX7 (K1)', values: [true, false] });
    expect(targets.filter((t) => t.key.startsWith('%IX'))).toHaveLength(8);
    expect(targets.filter((t) => t.key.startsWith('%QX'))).toHaveLength(6);
  });

  it('makes a new step of every action that the shared validator accepts on the default panel', () => {
    for (const action of STEP_ACTIONS) {
      // Ended by a check: a script without one is refused.
      const script: DraftScript = { panel: panel.id, steps: [newStep(action, panel), { expect: { K1: 'open' } }] };
      expect(validateScript(script, panel), action).toMatchObject({ ok: true, errors: [] });
      expect(draftAction(script.steps[0]!)).toBe(action);
    }
  });

  it('inserts, removes and moves steps without touching the others', () => {
    const a: DraftStep = { press: 'S2' };
    const b: DraftStep = { wait: 100 };
    const c: DraftStep = { release: 'S2' };
    expect(insertStep([a, c], 0, b)).toEqual([a, b, c]);
    expect(insertStep([a, b], -1, c)).toEqual([c, a, b]);
    expect(insertStep([a, b], 99, c)).toEqual([a, b, c]);
    expect(removeStep([a, b, c], 1)).toEqual([a, c]);
    expect(moveStep([a, b, c], 0, 1)).toEqual([b, a, c]);
    expect(moveStep([a, b, c], 2, -5)).toEqual([c, a, b]);
    expect(moveStep([a, b, c], 2, 1)).toEqual([a, b, c]);
  });

  it('keeps the device when the new action can take it, and picks one that can when not', () => {
    expect(changeAction({ press: 'S2' }, 'release', panel)).toEqual({ release: 'S2' });
    expect(changeAction({ press: 'S2' }, 'trip', panel)).toEqual({ trip: 'F1' });
    expect(changeAction({ press: 'S2' }, 'set', panel)).toEqual({ set: 'S4', to: 'JOG' });
  });

  it('edits a check: one expectation at a time, label, points and hidden', () => {
    let step: DraftStep = { expect: { K1: 'open' } };
    step = setExpectation(step, 'P1', 'lit');
    step = setExpectation(step, 'K1', undefined);
    step = setCheckField(step, 'points', 3);
    step = setCheckField(step, 'hidden', true);
    step = setCheckField(step, 'label', 'green lamp');
    expect(step).toEqual({ expect: { P1: 'lit' }, points: 3, hidden: true, label: 'green lamp' });
    expect(setCheckField(setCheckField(step, 'hidden', false), 'label', '')).toEqual({ expect: { P1: 'lit' }, points: 3 });
    // Not a check: the edit changes nothing.
    expect(setExpectation({ wait: 10 }, 'K1', 'open')).toEqual({ wait: 10 });
  });

  it('adds up the points, counting 1 for a check that does not say', () => {
    expect(totalPoints({ steps: [{ expect: { K1: 'open' } }, { wait: 10 }, { expect: { K1: 'closed' }, points: 4 }] })).toBe(5);
    // Three-wire: 1 + 2 + 1 + 1 + 2 + 1 + 2 + 1 (read off the lab's script by hand).
    expect(totalPoints(THREE_WIRE.script)).toBe(13);
  });

  it('round-trips every standard lab script between the step list and the JSON view', () => {
    for (const lab of STANDARD_LABS) {
      const read = parseScriptJson(scriptToJson(lab.script));
      expect(read, lab.id).toEqual({ ok: true, script: lab.script });
      expect(validateScript(lab.script, panel).ok, lab.id).toBe(true);
    }
  });

  it('round-trips any step list built from the editor’s own edits', () => {
    const action = fc.constantFrom<StepAction>(...STEP_ACTIONS);
    fc.assert(
      fc.property(fc.array(fc.tuple(action, fc.integer({ min: -1, max: 10 })), { maxLength: 12 }), (edits) => {
        let steps: DraftStep[] = [];
        for (const [a, at] of edits) steps = insertStep(steps, at, newStep(a, panel));
        const script: DraftScript = { panel: panel.id, scanMs: 10, steps };
        const read = parseScriptJson(scriptToJson(script));
        expect(read).toEqual({ ok: true, script });
      }),
    );
  });

  it('says what is wrong with JSON that cannot be read, instead of throwing', () => {
    expect(parseScriptJson('{ "steps": [ ')).toMatchObject({ ok: false, error: expect.stringMatching(/^The JSON cannot be read/) });
    expect(parseScriptJson('[1, 2]')).toEqual({ ok: false, error: 'A check script is a JSON object with "steps".' });
    expect(parseScriptJson('{ "panel": "reversing-conveyor" }')).toEqual({ ok: false, error: 'A check script needs "steps": a list of steps.' });
    expect(parseScriptJson('{ "steps": [ { "press": "S2" }, 7 ] }')).toEqual({ ok: false, error: 'Step 2 is not an object such as { "press": "S2" }.' });
  });

  it('files each validation message under the step it names', () => {
    const script = { panel: panel.id, steps: [{ press: 'S2' }, { wait: -5 }, { trip: 'K1' }, { expect: { K1: 'lit' } }] };
    const shape = validateScript(script, panel);
    expect(shape.ok).toBe(false);
    expect(shape.byStep.get(2)).toEqual([expect.stringMatching(/^step 2: "wait" needs a whole number of ms/)]);
    // Shape first: only once the shape is right does the panel fit run.
    const fixed = validateScript({ ...script, steps: [{ press: 'S2' }, { wait: 5 }, { trip: 'K1' }, { expect: { K1: 'lit' } }] }, panel);
    expect(fixed.byStep.get(3)).toEqual(['step 3: "trip" needs the id of an overload relay, got "K1" (a contactor)']);
    expect(fixed.byStep.get(4)?.[0]).toMatch(/^step 4: "K1" is a contactor: expect "open" or "closed", got "lit"/);
    expect(fixed.byStep.has(1)).toBe(false);
  });

  it('shows the timed checks, forces and preheat as readable text, and counts the points of every check', () => {
    const steps: DraftStep[] = [
      { during: 5000, never: { K1: 'closed', K2: 'closed' }, label: 'never both', points: 2 },
      { until: { F1: 'tripped' }, within: [4001, 10000], hidden: true },
      { force: '%IX2', to: true },
      { unforce: 'all' },
      { unforce: '%IX2' },
      { preheat: 'F1', factor: 1 },
      { power: 'off' },
      { power: 'on' },
    ];
    expect(steps.map(describeDraftStep)).toEqual([
      'check “never both”: never K1 closed, K2 closed for 5000 ms (2 pts)',
      'check: F1 tripped first between 4001 and 10000 ms (1 pt, hidden)',
      'force %IX2 to true',
      'remove every force',
      'remove the force on %IX2',
      'preheat F1 (steady at 1 × its setting)',
      'controller power off',
      'controller power on (warm restart)',
    ]);
    expect(newStep('power', panel)).toEqual({ power: 'off' });
    expect(devicesFor('power', panel)).toEqual([]);
    expect(validateScript({ panel: panel.id, steps: [newStep('power', panel), newStep('force', panel), newStep('unforce', panel), { expect: { K1: 'open' } }] }, panel).ok).toBe(true);
    expect(totalPoints({ panel: panel.id, steps })).toBe(3);
    expect(devicesFor('preheat', panel).map((d) => d.id)).toEqual(['F1']);
    expect(devicesFor('force', panel)).toEqual([]);
  });

  it('files a script-wide problem under step 0', () => {
    const result = validateScript({ panel: 'other-panel', steps: [{ wait: 1 }, { expect: { K1: 'open' } }] }, panel);
    expect(result.byStep.get(0)).toEqual(['the script is written for panel "other-panel", but the panel given is "reversing-conveyor"']);
  });
});
