/**
 * The facts of the trade the simulator must honour (docs/names-and-rules.md, common practice): each scenario
 * runs a program on the default panel and looks at the field, not just at the program's bits.
 */
import { describe, expect, it } from 'vitest';
import { buildProgram, coil, nc, no, rung } from '@shared/labs/build';
import { allOutputsOn, noInterlock, program, pulse, simulate, threeWire, twoWire } from './helpers';

describe('common practice: a normally closed stop button', () => {
  it('reads TRUE at rest, so a rung examining it with an NO contact is energised until it is pressed', () => {
    const sim = simulate(program(rung('', no('Stop_PB'), coil('Red_Lamp'))));
    sim.run(50);
    expect(sim.runtime.read('%IX1')).toBe(true);
    expect(sim.word('P2')).toBe('lit');
    sim.press('S1');
    sim.run(20);
    expect(sim.runtime.read('%IX1')).toBe(false);
    expect(sim.word('P2')).toBe('dark');
  });
  it('examined with an NC contact the rung is dead at rest (the classic mistake)', () => {
    const sim = simulate(program(rung('', nc('Stop_PB'), coil('Red_Lamp'))));
    sim.run(50);
    expect(sim.word('P2')).toBe('dark');
  });
});

describe('common practice: the hardwired emergency stop', () => {
  it('removes every input and de-energises every load while the program keeps scanning and output bits stay ON', () => {
    const sim = simulate(allOutputsOn());
    sim.set('S4', 'RUN');
    sim.block('B1');
    sim.run(50);
    expect(['P1', 'P2', 'P3', 'H1'].map((id) => sim.word(id))).toEqual(['lit', 'lit', 'lit', 'sounding']);
    expect(sim.runtime.read('%IX4')).toBe(true);
    sim.press('S0');
    const scansBefore = sim.scanCount;
    sim.run(50);
    expect(sim.scanCount).toBe(scansBefore + 5);
    for (let i = 1; i <= 8; i += 1) expect(sim.runtime.read(`%IX${i}`)).toBe(false);
    expect(['P1', 'P2', 'P3', 'H1'].map((id) => sim.word(id))).toEqual(['dark', 'dark', 'dark', 'silent']);
    expect([3, 4, 5, 6].map((q) => sim.runtime.getOutput(q))).toEqual([true, true, true, true]);
    expect(sim.events().some((e) => e.message === 'S0 pressed: input and output commons de-energised')).toBe(true);
  });
  it('drops a running contactor at once whatever the program says', () => {
    const sim = simulate(threeWire());
    pulse(sim, 'S2', 100, 700);
    expect(sim.word('K1')).toBe('closed');
    sim.press('S0');
    sim.run(50);
    expect(sim.word('K1')).toBe('open');
    expect(sim.events().some((e) => e.message === 'K1 dropped out: output common de-energised (S0 21-22 open)')).toBe(true);
  });
});

describe('common practice: the overload has the last word', () => {
  it('a trip drops the contactor while its output stays ON, and the auxiliary input falls', () => {
    const sim = simulate(program(rung('', no('Stop_PB'), coil('K1_Coil'))));
    sim.run(700);
    expect(sim.word('K1')).toBe('closed');
    expect(sim.runtime.read('%IX7')).toBe(true);
    sim.trip('F1');
    sim.run(50);
    expect(sim.word('K1')).toBe('open');
    expect(sim.runtime.getOutput(1)).toBe(true);
    expect(sim.runtime.read('%IX7')).toBe(false);
    expect(sim.runtime.read('%IX6')).toBe(true);
    expect(sim.events().map((e) => e.message)).toContain('K1 dropped out: F1 95-96 opened');
    expect(sim.explain().outputs[0]!.reason).toBe('%QX1 ON, K1 open (F1 95-96 open)');
  });
  it('after the reset the contactor recloses by itself if the output is still ON', () => {
    const sim = simulate(program(rung('', no('Stop_PB'), coil('K1_Coil'))));
    sim.run(700);
    sim.trip('F1');
    sim.run(50);
    expect(sim.reset('F1')).toEqual({ ok: true });
    sim.run(50);
    expect(sim.word('K1')).toBe('closed');
  });
  it('a jammed belt trips F1 by heat; the event says at what multiple and after how long', () => {
    const sim = simulate(program(rung('', no('Stop_PB'), coil('K1_Coil'))));
    sim.run(1000);
    sim.load('M1', 7.2);
    sim.run(10_000);
    expect(sim.word('F1')).toBe('tripped');
    expect(sim.word('K1')).toBe('open');
    const trip = sim.events().find((e) => e.kind === 'overload');
    // 8.0 s from cold (docs/published-values.md, class 10); the starting current and 1 s at full load warmed it a little first.
    expect(trip?.message).toMatch(/^F1 tripped at 7\.2 × setting after 7\.[5-9] s$/);
  });
});

describe('common practice: the mechanical interlock', () => {
  it('never lets K1 and K2 close together, even when the program commands both', () => {
    const sim = simulate(noInterlock());
    pulse(sim, 'S2', 100, 700);
    sim.press('S3');
    sim.run(200);
    expect(sim.runtime.getOutput(2)).toBe(true);
    expect(sim.word('K1')).toBe('closed');
    expect(sim.word('K2')).toBe('open');
    expect(sim.events().map((e) => e.message)).toContain('K2 held open by the mechanical interlock: K1 is engaged');
    expect(sim.explain().outputs[1]!.reason).toBe('%QX2 ON, K2 open (held by the mechanical interlock)');
  });
  it('lets neither close and reports a conflict when both coils are energised in the same scan', () => {
    const sim = simulate(noInterlock());
    sim.press('S2');
    sim.press('S3');
    sim.run(200);
    expect([sim.word('K1'), sim.word('K2'), sim.word('R1')]).toEqual(['open', 'open', 'conflict']);
    expect(sim.events().some((e) => e.kind === 'interlock' && e.message.includes('interlock conflict'))).toBe(true);
  });
});

describe('common practice: resetting the e-stop must not by itself restart the machine', () => {
  it('a two-wire circuit restarts when the e-stop is released', () => {
    const sim = simulate(twoWire());
    sim.set('S4', 'RUN');
    sim.run(700);
    expect(sim.word('M1')).toBe('forward');
    sim.press('S0');
    sim.run(2000);
    expect(sim.word('M1')).toBe('stopped');
    sim.release('S0');
    sim.run(700);
    expect(sim.word('K1')).toBe('closed');
    expect(sim.word('M1')).toBe('forward');
  });
  it('a three-wire seal-in circuit stays stopped after the e-stop is released', () => {
    const sim = simulate(threeWire());
    pulse(sim, 'S2', 100, 700);
    sim.press('S0');
    sim.run(2000);
    sim.release('S0');
    sim.run(2000);
    expect(sim.word('K1')).toBe('open');
    expect(sim.word('M1')).toBe('stopped');
    expect(sim.runtime.getOutput(1)).toBe(false);
  });
});

describe('nothing about the circuits is hard-coded', () => {
  it('runs a panel without an overload relay: the coil circuits have no series contact', async () => {
    const { parsePanelLayout, REVERSING_CONVEYOR_INPUT } = await import('@shared/field');
    const layout = JSON.parse(JSON.stringify(REVERSING_CONVEYOR_INPUT));
    layout.devices = layout.devices.filter((d: { id: string }) => d.id !== 'F1');
    for (const d of layout.devices) d.through = [];
    const parsed = parsePanelLayout(layout);
    if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
    const sim = simulate(threeWire(), parsed.value);
    pulse(sim, 'S2', 100, 700);
    expect(sim.word('K1')).toBe('closed');
    sim.load('M1', 7.2);
    sim.run(30_000);
    expect(sim.word('K1')).toBe('closed');
    expect(sim.trip('F1')).toEqual({ ok: false, error: 'no device "F1" on this panel' });
  });

  it('runs a panel with a second e-stop in series on both commons: either one stops everything', async () => {
    const { parsePanelLayout, REVERSING_CONVEYOR_INPUT } = await import('@shared/field');
    const layout = JSON.parse(JSON.stringify(REVERSING_CONVEYOR_INPUT));
    layout.devices.push({ id: 'S9', kind: 'estop', label: 'Tail-end emergency stop', params: {} });
    layout.inputCommon.push({ device: 'S9', contact: '11-12' });
    layout.outputCommon.push({ device: 'S9', contact: '21-22' });
    const parsed = parsePanelLayout(layout);
    if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
    const sim = simulate(program(rung('', no('Stop_PB'), coil('Red_Lamp'))), parsed.value);
    sim.run(50);
    expect(sim.word('P2')).toBe('lit');
    sim.press('S9');
    sim.run(50);
    expect(sim.word('P2')).toBe('dark');
    expect(sim.runtime.read('%IX1')).toBe(false);
    expect(sim.explain().inputs[0]!.reason).toBe('%IX1 FALSE: input common de-energised (S9 11-12 open); S1 11-12 closed (NC, released)');
    sim.release('S9');
    sim.press('S0');
    sim.run(50);
    expect(sim.word('P2')).toBe('dark');
    sim.release('S0');
    sim.run(50);
    expect(sim.word('P2')).toBe('lit');
  });

  it('runs a different layout: a lamp behind a limit switch in series, with more inputs', async () => {
    const { parsePanelLayout } = await import('@shared/field');
    const parsed = parsePanelLayout({
      format: 'rungwright.panel',
      version: 1,
      id: 'door-lamp',
      title: 'Guard door lamp (test layout)',
      inputs: 2,
      outputs: 1,
      devices: [
        { id: 'S1', kind: 'pushbutton', label: 'Lamp on', params: { form: 'NO', colour: 'white' }, feeds: '%IX1' },
        { id: 'B1', kind: 'limit', label: 'Guard door', params: {}, feeds: '%IX2', contact: '21-22' },
        { id: 'P1', kind: 'lamp', label: 'Work light', params: { colour: 'white' }, drivenBy: '%QX1', through: [{ device: 'B1', contact: '13-14' }] },
      ],
    });
    if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
    const p = buildProgram('t', '', [], [rung('', no('%IX1'), coil('%QX1'))]);
    const sim = simulate(p, parsed.value);
    sim.press('S1');
    sim.run(30);
    expect(sim.word('P1')).toBe('dark');
    expect(sim.runtime.read('%IX2')).toBe(true);
    sim.press('B1');
    sim.run(30);
    expect(sim.word('P1')).toBe('lit');
    expect(sim.runtime.read('%IX2')).toBe(false);
  });
});
