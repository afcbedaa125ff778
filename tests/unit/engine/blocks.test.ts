import { describe, expect, it } from 'vitest';
import { BLOCK_SPECS, BLOCK_TYPES } from '@shared/ladder/blocks';
import { BLOCK_BEHAVIOURS, isStateOf, readMember } from '@shared/engine/blocks/behaviours';
import { stepTOF, stepTON, stepTP, DELAY_TIMER_INITIAL, PULSE_TIMER_INITIAL } from '@shared/engine/blocks/timers';
import {
  INT_MAX,
  INT_MIN,
  stepCTD,
  stepCTU,
  stepCTUD,
  DOWN_COUNTER_INITIAL,
  UP_COUNTER_INITIAL,
  UP_DOWN_COUNTER_INITIAL,
} from '@shared/engine/blocks/counters';
import { stepFTrig, stepRS, stepRTrig, stepSR, BISTABLE_INITIAL, EDGE_INITIAL } from '@shared/engine/blocks/bistables';

/** Apply a step over a list of inputs, collecting every state. */
function trail<S, I>(step: (s: S, i: I, dt: number) => S, initial: S, inputs: I[], dt = 10): S[] {
  const states: S[] = [];
  let state = initial;
  for (const input of inputs) {
    state = step(state, input, dt);
    states.push(state);
  }
  return states;
}

describe('the block table', () => {
  it('describes every block type of the palette', () => {
    expect(Object.keys(BLOCK_BEHAVIOURS).sort()).toEqual([...BLOCK_TYPES].sort());
  });

  it("gives every state a field for each of the standard's outputs", () => {
    for (const type of BLOCK_TYPES) {
      const initial = BLOCK_BEHAVIOURS[type].initial;
      for (const output of BLOCK_SPECS[type].outputs) {
        const value = readMember(initial, output.name);
        expect(typeof value, `${type}.${output.name}`).toBe(output.type === 'BOOL' ? 'boolean' : 'number');
      }
    }
  });

  it('freezes the initial states so no step can change them in place', () => {
    for (const type of BLOCK_TYPES) expect(Object.isFrozen(BLOCK_BEHAVIOURS[type].initial)).toBe(true);
  });

  it('recognises a state of the right shape and refuses others', () => {
    expect(isStateOf('TON', { Q: true, ET: 20 })).toBe(true);
    expect(isStateOf('TON', { Q: 'yes', ET: 20 })).toBe(false);
    expect(isStateOf('TON', { Q: true })).toBe(false);
    expect(isStateOf('CTU', { Q: true, ET: 20 })).toBe(false);
    expect(isStateOf('CTU', { Q: false, CV: Number.NaN, lastCU: false })).toBe(false);
    expect(isStateOf('SR', null)).toBe(false);
  });
});

describe('TON', () => {
  it('counts the scan period while IN is on and turns Q on when ET reaches PT', () => {
    const states = trail(stepTON, DELAY_TIMER_INITIAL, Array.from({ length: 5 }, () => ({ IN: true, PT: 30 })));
    expect(states.map((s) => s.ET)).toEqual([10, 20, 30, 30, 30]);
    expect(states.map((s) => s.Q)).toEqual([false, false, true, true, true]);
  });

  it('drops Q and clears ET at once when IN falls', () => {
    const [, , , off] = trail(stepTON, DELAY_TIMER_INITIAL, [
      { IN: true, PT: 20 },
      { IN: true, PT: 20 },
      { IN: true, PT: 20 },
      { IN: false, PT: 20 },
    ]);
    expect(off).toEqual({ Q: false, ET: 0 });
  });

  it('treats a negative preset as zero and a call charged no time as no time', () => {
    expect(stepTON(DELAY_TIMER_INITIAL, { IN: true, PT: -5 }, 10)).toEqual({ Q: true, ET: 0 });
    expect(stepTON(DELAY_TIMER_INITIAL, { IN: true, PT: 50 }, 0)).toEqual({ Q: false, ET: 0 });
  });

  it('returns the same state object while nothing changes', () => {
    const done = { Q: true, ET: 30 };
    expect(stepTON(done, { IN: true, PT: 30 }, 10)).toBe(done);
    expect(stepTON(DELAY_TIMER_INITIAL, { IN: false, PT: 30 }, 10)).toBe(DELAY_TIMER_INITIAL);
  });
});

describe('TOF', () => {
  it('holds Q on for PT after IN falls, then holds ET at PT', () => {
    const inputs = [true, false, false, false, false].map((IN) => ({ IN, PT: 30 }));
    const states = trail(stepTOF, DELAY_TIMER_INITIAL, inputs);
    expect(states.map((s) => s.Q)).toEqual([true, true, true, false, false]);
    expect(states.map((s) => s.ET)).toEqual([0, 10, 20, 30, 30]);
  });

  it('restarts with ET 0 and Q still on when IN returns before PT', () => {
    const inputs = [true, false, true].map((IN) => ({ IN, PT: 30 }));
    expect(trail(stepTOF, DELAY_TIMER_INITIAL, inputs).at(-1)).toEqual({ Q: true, ET: 0 });
  });

  it('stays off with ET 0 when IN has never been on', () => {
    expect(stepTOF(DELAY_TIMER_INITIAL, { IN: false, PT: 30 }, 10)).toBe(DELAY_TIMER_INITIAL);
  });
});

describe('TP', () => {
  it('gives one pulse of PT on a rising edge and ignores edges during the pulse', () => {
    const ins = [true, false, true, false, false, false];
    const states = trail(stepTP, PULSE_TIMER_INITIAL, ins.map((IN) => ({ IN, PT: 40 })));
    expect(states.map((s) => s.Q)).toEqual([true, true, true, false, false, false]);
    expect(states.map((s) => s.ET)).toEqual([10, 20, 30, 40, 0, 0]);
  });

  it('holds ET at PT after the pulse while IN stays on', () => {
    const states = trail(stepTP, PULSE_TIMER_INITIAL, Array.from({ length: 5 }, () => ({ IN: true, PT: 20 })));
    expect(states.map((s) => s.Q)).toEqual([true, false, false, false, false]);
    expect(states.map((s) => s.ET)).toEqual([10, 20, 20, 20, 20]);
  });

  it('shows a pulse shorter than the scan for one scan, and none for a zero preset', () => {
    expect(stepTP(PULSE_TIMER_INITIAL, { IN: true, PT: 5 }, 10).Q).toBe(true);
    expect(stepTP(PULSE_TIMER_INITIAL, { IN: true, PT: 0 }, 10).Q).toBe(false);
  });
});

describe('CTU', () => {
  it('adds one per rising edge of CU, not per scan CU is held', () => {
    const cu = [true, true, false, true, false, true];
    const states = trail(stepCTU, UP_COUNTER_INITIAL, cu.map((CU) => ({ CU, R: false, PV: 3 })));
    expect(states.map((s) => s.CV)).toEqual([1, 1, 1, 2, 2, 3]);
    expect(states.at(-1)!.Q).toBe(true);
  });

  it('gives R priority over a count edge in the same call', () => {
    expect(stepCTU({ Q: true, CV: 5, lastCU: false }, { CU: true, R: true, PV: 3 })).toEqual({ Q: false, CV: 0, lastCU: true });
  });

  it('stops at the largest INT', () => {
    expect(stepCTU({ Q: true, CV: INT_MAX, lastCU: false }, { CU: true, R: false, PV: 3 }).CV).toBe(INT_MAX);
  });
});

describe('CTD', () => {
  it('loads PV on LD and subtracts one per rising edge of CD, below zero too', () => {
    const steps = [
      { CD: false, LD: true, PV: 2 },
      { CD: true, LD: false, PV: 2 },
      { CD: false, LD: false, PV: 2 },
      { CD: true, LD: false, PV: 2 },
      { CD: false, LD: false, PV: 2 },
      { CD: true, LD: false, PV: 2 },
    ];
    const states = trail(stepCTD, DOWN_COUNTER_INITIAL, steps);
    expect(states.map((s) => s.CV)).toEqual([2, 1, 1, 0, 0, -1]);
    expect(states.map((s) => s.Q)).toEqual([false, false, false, true, true, true]);
  });

  it('stops at the smallest INT', () => {
    expect(stepCTD({ Q: true, CV: INT_MIN, lastCD: false }, { CD: true, LD: false, PV: 2 }).CV).toBe(INT_MIN);
  });
});

describe('CTUD', () => {
  const idle = { CU: false, CD: false, R: false, LD: false, PV: 2 };

  it('counts up on CU edges and down on CD edges', () => {
    const states = trail(stepCTUD, UP_DOWN_COUNTER_INITIAL, [
      { ...idle, CU: true },
      idle,
      { ...idle, CU: true },
      idle,
      { ...idle, CD: true },
    ]);
    expect(states.map((s) => s.CV)).toEqual([1, 1, 2, 2, 1]);
    expect(states[2]).toMatchObject({ QU: true, QD: false });
  });

  it('leaves CV as it was when CU and CD rise in the same call', () => {
    const state = { ...UP_DOWN_COUNTER_INITIAL, CV: 1 };
    expect(stepCTUD(state, { ...idle, CU: true, CD: true }).CV).toBe(1);
  });

  it('gives R priority over LD, and LD over counting', () => {
    const state = { ...UP_DOWN_COUNTER_INITIAL, CV: 1 };
    expect(stepCTUD(state, { ...idle, R: true, LD: true, CU: true }).CV).toBe(0);
    expect(stepCTUD(state, { ...idle, LD: true, CU: true, PV: 7 }).CV).toBe(7);
  });

  it('sets QD when CV is zero or less', () => {
    expect(stepCTUD(UP_DOWN_COUNTER_INITIAL, idle)).toMatchObject({ QU: false, QD: true, CV: 0 });
  });
});

describe('edge detectors and bistables', () => {
  it('R_TRIG is on for the one call where CLK rises', () => {
    const states = trail(stepRTrig, EDGE_INITIAL, [true, true, false, true].map((CLK) => ({ CLK })));
    expect(states.map((s) => s.Q)).toEqual([true, false, false, true]);
  });

  it('F_TRIG is on for the one call where CLK falls, and not on a first call with CLK off', () => {
    const states = trail(stepFTrig, EDGE_INITIAL, [false, true, false, false].map((CLK) => ({ CLK })));
    expect(states.map((s) => s.Q)).toEqual([false, false, true, false]);
  });

  it('SR sets, holds and resets, and sets when both are on', () => {
    const s = trail(stepSR, BISTABLE_INITIAL, [
      { S1: true, R: false },
      { S1: false, R: false },
      { S1: false, R: true },
      { S1: true, R: true },
    ]);
    expect(s.map((x) => x.Q1)).toEqual([true, true, false, true]);
  });

  it('RS sets, holds and resets, and resets when both are on', () => {
    const s = trail(stepRS, BISTABLE_INITIAL, [
      { S: true, R1: false },
      { S: false, R1: false },
      { S: true, R1: true },
    ]);
    expect(s.map((x) => x.Q1)).toEqual([true, true, false]);
  });
});
