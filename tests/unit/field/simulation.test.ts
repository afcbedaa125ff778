import { describe, expect, it } from 'vitest';
import { createEventLog, createSimulation, REVERSING_CONVEYOR } from '@shared/field';
import { coil, nc, no, par, rung } from '@shared/labs/build';
import { noInterlock, program, pulse, simulate, threeWire } from './helpers';

describe('createSimulation', () => {
  it('returns compile errors as diagnostics instead of throwing', () => {
    const result = createSimulation({ program: program(rung('', no('%IX9'), coil('K1_Coil'))), panel: REVERSING_CONVEYOR });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.diagnostics.length).toBeGreaterThan(0);
    expect(result.error).toMatch(/^the program does not compile: .*%IX9/);
  });
  it('refuses a scan period outside 1..1000 ms with a message', () => {
    const result = createSimulation({ program: threeWire(), panel: REVERSING_CONVEYOR, scanMs: 0 });
    expect(result).toMatchObject({ ok: false, diagnostics: [] });
    if (!result.ok) expect(result.error).toMatch(/scan period/);
  });
  it('runs whole scans of virtual time', () => {
    const sim = simulate(threeWire(), REVERSING_CONVEYOR, 7);
    sim.run(100);
    expect(sim.scanCount).toBe(15);
    expect(sim.timeMs).toBe(105);
  });
});

describe('device actions', () => {
  it('say why an action does not apply, without changing anything', () => {
    const sim = simulate(threeWire());
    expect(sim.act('K1', 'press')).toEqual({ ok: false, error: 'K1 is a contactor: it cannot be given "press"' });
    expect(sim.act('Z9', 'press')).toEqual({ ok: false, error: 'no device "Z9" on this panel' });
    expect(sim.set('S4', 'AUTO')).toEqual({ ok: false, error: 'position "AUTO" does not exist; it has JOG, RUN' });
    expect(sim.events().at(-1)?.kind).toBe('refused');
  });
  it('log a refused overload reset while it is still hot', () => {
    const sim = simulate(program(rung('', no('Stop_PB'), coil('K1_Coil'))));
    sim.run(1000);
    sim.load('M1', 6);
    sim.run(15_000);
    expect(sim.word('F1')).toBe('tripped');
    const refused = sim.reset('F1');
    expect(refused.ok).toBe(false);
    expect(sim.events().at(-1)?.message).toMatch(/^F1 reset refused: still too hot to reset/);
  });
});

describe('the event log', () => {
  it('tells a start, plugging and a stop in words', () => {
    const sim = simulate(
      program(
        rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')),
        rung('', no('Rev_PB'), coil('K2_Coil')),
      ),
    );
    pulse(sim, 'S2', 100, 700);
    pulse(sim, 'S1', 100, 20);
    sim.press('S3');
    sim.run(300);
    const messages = sim.events().map((e) => e.message);
    expect(messages).toContain('S2 pressed');
    expect(messages).toContain('K1 picked up');
    expect(messages).toContain('M1 starting forward, drawing 6.0 × FLA (14.4 A) until at speed');
    expect(messages).toContain('K1 dropped out: %QX1 turned OFF');
    expect(messages).toContain('M1 supply removed: coasting to rest');
    expect(messages.some((m) => m.startsWith('M1 plugging: switched to reverse while turning forward, drawing 6.0 × FLA'))).toBe(true);
  });
  it('stamps each event with the virtual time and scan', () => {
    const sim = simulate(threeWire());
    sim.run(50);
    sim.press('S2');
    sim.run(40);
    const pickUp = sim.events().find((e) => e.message === 'K1 picked up');
    // Pressed at 50 ms; read in the scan ending at 60 ms; 25 ms pick-up counted in 10 ms field steps.
    expect(pickUp).toMatchObject({ atMs: 80, scan: 8, device: 'K1', kind: 'contactor' });
  });
  it('keeps the latest events within its capacity and counts the rest', () => {
    const log = createEventLog(4);
    for (let i = 0; i < 10; i += 1) log.push({ atMs: i, scan: i, device: null, kind: 'action', message: `e${i}` });
    expect(log.list().map((e) => e.message)).toEqual(['e6', 'e7', 'e8', 'e9']);
    expect(log.total).toBe(10);
    expect(log.dropped).toBe(6);
    expect(log.since(8).map((e) => e.seq)).toEqual([8, 9]);
  });
});

describe('the I/O explanation', () => {
  it('lists every input with its contact, the common and the bit', () => {
    const sim = simulate(threeWire());
    sim.run(20);
    const rows = sim.explain().inputs;
    expect(rows).toHaveLength(8);
    expect(rows[0]).toMatchObject({ address: '%IX1', device: 'S1', contact: '11-12', form: 'NC', contactClosed: true, commonLive: true, bit: true });
    expect(rows[0]!.reason).toBe('%IX1 TRUE: S1 11-12 closed (NC, released)');
    expect(rows[3]!.reason).toBe('%IX4 FALSE: S4 RUN open (NO, JOG)');
  });
  it('explains an output that is ON while its load is off', () => {
    // %QX1 is ON whatever the inputs say: the stop bit OR its negation.
    const sim = simulate(program(rung('', par(no('Stop_PB'), nc('Stop_PB')), coil('K1_Coil'))));
    sim.run(700);
    sim.press('S0');
    sim.run(10);
    const out = sim.explain();
    expect(out.outputCommonLive).toBe(false);
    expect(out.outputCommonOpen).toEqual(['S0 21-22']);
    expect(out.outputs[0]!.reason).toBe('%QX1 ON, K1 closed (output common de-energised: S0 21-22 open)');
    sim.run(30);
    expect(sim.explain().outputs[0]!.reason).toBe('%QX1 ON, K1 open (output common de-energised: S0 21-22 open)');
    sim.release('S0');
    sim.run(10);
    expect(sim.explain().outputs[0]!.reason).toBe('%QX1 ON, K1 open (picking up)');
    expect(sim.explain().outputs[2]!.reason).toBe('%QX3 OFF, H1 silent');
  });
  it('marks forced bits', () => {
    const sim = simulate(threeWire());
    expect(sim.runtime.force('%IX2', true).ok).toBe(true);
    sim.run(20);
    const row = sim.explain().inputs[1]!;
    expect(row.forced).toBe(true);
    expect(row.bit).toBe(true);
    expect(row.reason).toBe('%IX2 TRUE: S2 13-14 open (NO, released) (forced TRUE)');
  });
});

describe('device views', () => {
  it('give the word, the contacts and figures per kind', () => {
    const sim = simulate(threeWire());
    pulse(sim, 'S2', 100, 700);
    expect(sim.device('K1')).toMatchObject({ word: 'closed', energised: true, contacts: [{ name: '13-14', closed: true }, { name: '21-22', closed: false }] });
    expect(sim.device('M1')!.detail).toMatchObject({ direction: 'forward', speed: 1, currentA: 2.4 });
    expect(sim.device('F1')!.detail).toMatchObject({ tripped: false, multiple: 1 });
    expect(sim.devices()).toHaveLength(REVERSING_CONVEYOR.devices.length);
    expect(sim.energised('K1')).toBe(true);
    expect(sim.energised('S1')).toBe(false);
  });
});

describe('determinism', () => {
  it('gives the same events and the same engine state when run twice', () => {
    const once = () => {
      const sim = simulate(noInterlock());
      pulse(sim, 'S2', 100, 700);
      sim.load('M1', 3);
      sim.run(5000);
      pulse(sim, 'S3');
      sim.trip('F1');
      sim.run(100);
      return JSON.stringify({ events: sim.events(), devices: sim.devices(), snap: sim.runtime.snapshot() });
    };
    expect(once()).toBe(once());
  });
});

describe('power flow', () => {
  it('is recorded from the first scan when asked for', () => {
    const result = createSimulation({ program: threeWire(), panel: REVERSING_CONVEYOR, recordPowerFlow: true });
    if (!result.ok) throw new Error(result.error);
    result.simulation.run(20);
    expect(result.simulation.runtime.powerFlow().recorded).toBe(true);
  });
});
