import { describe, expect, it } from 'vitest';
import { builtInPanel } from '@shared/field';
import { buildProgram, block, coil, no, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import { threeWireProgram, twoWireProgram } from '@/simulation/demoPrograms';
import { createSimulatorSession } from '@/simulation/session';

const panel = builtInPanel('reversing-conveyor')!;

/** The three-wire demo, started forward at RUN and left running for `ms`. */
function runningForward(ms = 600) {
  const session = createSimulatorSession({ program: threeWireProgram(), panel, scanMs: 10 });
  session.act('S4', 'set', { to: 'RUN' });
  session.act('S2', 'press');
  session.advance(10);
  session.act('S2', 'release');
  session.advance(ms / 10);
  return session;
}

describe('a simulator session', () => {
  it('runs the three-wire demo: sealed in after the start button is released', () => {
    const session = runningForward();
    const sim = session.simulation!;
    expect(sim.word('K1')).toBe('closed');
    expect(sim.word('M1')).toBe('forward');
    expect(sim.runtime.read('%QX1')).toBe(true);
    expect(sim.timeMs).toBe(700);
  });

  it('records every input and output in the trace, one row per scan', () => {
    const session = runningForward(100);
    expect(session.trace.length).toBe(20);
    const w = session.trace.window(['%IX2', '%QX1']);
    expect(w.times.slice(0, 2)).toEqual([10, 20]);
    expect(w.columns[0]!.slice(0, 10).every((v) => v === 1)).toBe(true);
    expect(w.columns[1]!.at(-1)).toBe(1);
  });

  it('logs why K1 dropped out when the overload trips, and says why %QX1 is ON while S2 is held', () => {
    const session = runningForward();
    session.act('F1', 'trip');
    session.advance(5);
    const messages = session.log.map((e) => e.message);
    expect(messages).toContain('K1 dropped out: F1 95-96 opened');
    // Sealed in on K1's auxiliary contact: the seal broke with K1, so %QX1 is OFF until S2 is held.
    expect(session.simulation!.runtime.read('%QX1')).toBe(false);
    session.act('S2', 'press');
    session.advance(2);
    expect(session.simulation!.explain().outputs[0]!.reason).toBe('%QX1 ON, K1 open (F1 95-96 open)');
  });

  it('cold restart clears memory, forces and the trace and puts the panel at rest', () => {
    const session = runningForward();
    session.force('%MX1', true);
    session.reset();
    const sim = session.simulation!;
    expect(sim.timeMs).toBe(0);
    expect(sim.runtime.forces().size).toBe(0);
    expect(sim.word('S4')).toBe('JOG');
    expect(sim.word('K1')).toBe('open');
    expect(session.trace.length).toBe(0);
    expect(session.log.at(-1)!.message).toMatch(/cold restart.*forces removed/);
  });

  it('keeps memory and the field when an edit recompiles while running', () => {
    const session = runningForward();
    const edited = threeWireProgram();
    edited.rungs[0]!.comment = 'Forward (edited comment)';
    session.setProgram(edited);
    expect(session.program).toBe(edited);
    session.advance(5);
    const sim = session.simulation!;
    expect(sim.word('K1')).toBe('closed');
    expect(sim.word('S4')).toBe('RUN');
    expect(sim.runtime.read('%QX1')).toBe(true);
    expect(sim.timeMs).toBe(750);
    expect(session.messages.at(-1)).toMatchObject({ severity: 'info' });
    expect(session.messages.at(-1)!.text).toMatch(/memory kept \(T1\)/);
  });

  it('says which timer could not be kept when an edit changes its type', () => {
    const tags = conveyorTags();
    const timerProgram = (type: 'TON' | 'TOF') =>
      buildProgram('t', '', tags, [rung('timer', no('Run_Sel'), block(type, 'T1', { PT: 'T#10s' })), rung('lamp', no('T1.Q'), coil('Red_Lamp'))]);
    const session = createSimulatorSession({ program: timerProgram('TON'), panel, scanMs: 10 });
    session.act('S4', 'set', { to: 'RUN' });
    session.advance(100);
    expect(session.simulation!.runtime.read('T1.ET')).toBe(1000);
    session.setProgram(timerProgram('TOF'));
    expect(session.messages.at(-1)).toMatchObject({ severity: 'warning' });
    expect(session.messages.at(-1)!.text).toContain('could not keep T1');
    expect(session.simulation!.runtime.read('T1.ET')).toBe(0);
  });

  it('keeps running the previous version when an edit does not compile, and says so', () => {
    const session = runningForward();
    const broken = threeWireProgram();
    broken.rungs[0]!.network.items[0] = { kind: 'contact', id: 'r1n1', variant: 'no', operand: 'No_Such_Tag' };
    session.setProgram(broken);
    expect(session.diagnostics.length).toBeGreaterThan(0);
    expect(session.messages.at(-1)!.severity).toBe('error');
    expect(session.messages.at(-1)!.text).toMatch(/still running the previous version/);
    expect(session.program).not.toBe(broken);
    session.advance(1);
    expect(session.simulation!.word('K1')).toBe('closed');
  });

  it('changes the scan period without losing the running state', () => {
    const session = runningForward();
    expect(session.setScanMs(5)).toEqual({ ok: true });
    session.advance(2);
    expect(session.simulation!.timeMs).toBe(710);
    expect(session.simulation!.word('K1')).toBe('closed');
    expect(session.setScanMs(0)).toMatchObject({ ok: false });
    expect(session.setScanMs(1001)).toMatchObject({ ok: false });
  });

  it('restarts a two-wire circuit when the e-stop is reset, but not a three-wire one', () => {
    const twoWire = createSimulatorSession({ program: twoWireProgram(), panel, scanMs: 10 });
    twoWire.act('S4', 'set', { to: 'RUN' });
    twoWire.advance(60);
    expect(twoWire.simulation!.word('M1')).toBe('forward');
    const threeWire = runningForward();
    for (const s of [twoWire, threeWire]) {
      s.act('S0', 'press');
      s.advance(200);
      expect(s.simulation!.word('M1')).toBe('stopped');
      s.act('S0', 'reset');
      s.advance(100);
    }
    expect(twoWire.simulation!.word('K1')).toBe('closed');
    expect(threeWire.simulation!.word('K1')).toBe('open');
  });

  it('refuses a force of something that is not a bit, with the reason', () => {
    const session = runningForward(10);
    const result = session.force('T1.ET', true);
    expect(result.ok).toBe(false);
    expect(result.ok === false && result.error).toMatch(/only bits/);
  });
});

describe('pressing a momentary button by hand', () => {
  it('lets at least one scan see a tap released before any scan ran', () => {
    const session = createSimulatorSession({ program: threeWireProgram(), panel, scanMs: 10 });
    session.act('S4', 'set', { to: 'RUN' });
    session.press('S2');
    session.release('S2');
    expect(session.simulation!.word('S2')).toBe('pressed');
    session.advance(1);
    expect(session.simulation!.word('S2')).toBe('released');
    expect(session.simulation!.runtime.read('%QX1')).toBe(true);
    // One 10 ms scan is shorter than K1's 25 ms pick-up, so the seal on its auxiliary contact never makes.
    session.advance(10);
    expect(session.simulation!.word('K1')).toBe('open');
  });

  it('releases at once when a scan has already seen the press', () => {
    const session = createSimulatorSession({ program: threeWireProgram(), panel, scanMs: 10 });
    session.press('S2');
    session.advance(1);
    session.release('S2');
    expect(session.simulation!.word('S2')).toBe('released');
  });
});
