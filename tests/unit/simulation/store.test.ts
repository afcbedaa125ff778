import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { threeWireProgram } from '@/simulation/demoPrograms';
import type { FrameScheduler } from '@/simulation/frameLoop';
import { useSimulationStore } from '@/stores/simulation';

/** A scheduler the test advances by hand: `frame(ms)` calls the pending callback at that time. */
function manualScheduler() {
  let pending: ((t: number) => void) | null = null;
  let now = 0;
  const scheduler: FrameScheduler = {
    request: (cb) => {
      pending = cb;
      return 1;
    },
    cancel: () => {
      pending = null;
    },
  };
  return {
    scheduler,
    frame(ms: number) {
      now += ms;
      const cb = pending;
      pending = null;
      cb?.(now);
    },
    get pending() {
      return pending !== null;
    },
  };
}

describe('the simulation store', () => {
  beforeEach(() => setActivePinia(createPinia()));

  it('runs whole scans paced by animation frames, and stops on pause', () => {
    const store = useSimulationStore();
    const clock = manualScheduler();
    store.useScheduler(clock.scheduler);
    store.load(threeWireProgram(), { scanMs: 10 });
    store.run();
    expect(store.mode).toBe('running');
    clock.frame(0); // sets the time base
    for (let i = 0; i < 60; i += 1) clock.frame(1000 / 60);
    expect(store.scanCount).toBe(100);
    expect(store.timeMs).toBe(1000);
    store.pause();
    expect(store.mode).toBe('paused');
    expect(clock.pending).toBe(false);
  });

  it('runs ten times faster at ×10', () => {
    const store = useSimulationStore();
    const clock = manualScheduler();
    store.useScheduler(clock.scheduler);
    store.load(threeWireProgram(), { scanMs: 10 });
    store.setSpeed('fast');
    store.run();
    clock.frame(0);
    for (let i = 0; i < 6; i += 1) clock.frame(1000 / 60);
    expect(store.scanCount).toBe(100);
  });

  it('steps one scan at a time and pauses', () => {
    const store = useSimulationStore();
    store.load(threeWireProgram(), { scanMs: 10 });
    expect(store.liveView).toBeNull();
    store.step();
    store.step();
    expect(store.scanCount).toBe(2);
    expect(store.mode).toBe('paused');
    // Stop_PB (S1, NC) reads TRUE at rest, so the first contact of rung 1 is energised on its right.
    expect(store.liveView!.get('r1n1')).toMatchObject({ left: true, right: true, closed: true, value: true });
  });

  it('shows the seal-in rung energised through K1_Coil once started and released', () => {
    const store = useSimulationStore();
    store.load(threeWireProgram(), { scanMs: 10 });
    store.act('S4', 'set', { to: 'RUN' });
    store.act('S2', 'press');
    for (let i = 0; i < 5; i += 1) store.step();
    store.act('S2', 'release');
    for (let i = 0; i < 5; i += 1) store.step();
    const live = store.liveView!;
    // r1: Stop_PB, par(Fwd_PB, ser(K1_Coil, Run_Sel)), NOT K2_Coil, coil K1_Coil — ids in build order.
    const [stop, parallel, fwd, seal, sealK1, sealRun, notK2, k1Coil] = ['r1n1', 'r1n2', 'r1n3', 'r1n4', 'r1n5', 'r1n6', 'r1n7', 'r1n8'];
    expect(live.get(stop)!.right).toBe(true);
    expect(live.get(fwd)).toMatchObject({ left: true, right: false, closed: false });
    expect(live.get(seal)!.right).toBe(true);
    expect(live.get(sealK1)).toMatchObject({ closed: true, value: true });
    expect(live.get(sealRun)!.closed).toBe(true);
    expect(live.get(parallel)!.right).toBe(true);
    expect(live.get(notK2)!.closed).toBe(true);
    expect(live.get(k1Coil)).toMatchObject({ left: true, right: true, value: true });
    expect(store.devices.find((d) => d.id === 'K1')!.word).toBe('closed');
  });

  it('forces a bit from the table, marks it, and removes every force in one action', () => {
    const store = useSimulationStore();
    store.load(threeWireProgram(), { scanMs: 10 });
    expect(store.force('%QX4', true)).toEqual({ ok: true });
    expect(store.force('Red_Lamp', false)).toEqual({ ok: true });
    store.step();
    expect(store.io!.outputs[3]).toMatchObject({ bit: true, forced: true });
    expect(store.io!.outputs[4]).toMatchObject({ bit: false, forced: true });
    expect([...store.forces.keys()].sort()).toEqual(['%QX4', '%QX5']);
    store.clearForces();
    store.step();
    expect(store.forces.size).toBe(0);
    expect(store.io!.outputs[4]).toMatchObject({ bit: true, forced: false });
  });

  it('recompiles an edit while running and keeps the machine running', () => {
    const store = useSimulationStore();
    store.load(threeWireProgram(), { scanMs: 10 });
    store.act('S4', 'set', { to: 'RUN' });
    store.act('S2', 'press');
    for (let i = 0; i < 10; i += 1) store.step();
    store.act('S2', 'release');
    const edited = threeWireProgram();
    edited.title = 'edited';
    store.setProgram(edited);
    store.step();
    expect(store.program!.title).toBe('edited');
    expect(store.devices.find((d) => d.id === 'K1')!.word).toBe('closed');
    expect(store.messages.at(-1)!.text).toMatch(/Recompiled while running/);
  });

  it('picks extra signals for the trace and records them from then on', () => {
    const store = useSimulationStore();
    store.load(threeWireProgram(), { scanMs: 10 });
    store.toggleTraced('T1.ET');
    store.step();
    expect(store.traced).toContain('T1.ET');
    expect(store.session!.trace.window(['T1.ET']).columns[0]).toEqual([0]);
    store.toggleTraced('T1.ET');
    expect(store.traced).not.toContain('T1.ET');
  });
});
