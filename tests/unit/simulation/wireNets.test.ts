import { describe, expect, it } from 'vitest';
import { layoutProgram } from '@/editor/layout';
import { threeWireProgram } from '@/simulation/demoPrograms';
import { createSimulatorSession } from '@/simulation/session';
import { createLiveView } from '@/simulation/liveView';
import { wireEnergised, wireNets } from '@/simulation/wireNets';
import { builtInPanel } from '@shared/field';

describe('connected conductors of a drawn rung', () => {
  it('joins untagged wires to the tagged wires they touch, and leaves elements as breaks', () => {
    const wires = [
      { x1: 0, y1: 0, x2: 10, y2: 0 }, // lead-in
      { x1: 10, y1: 0, x2: 20, y2: 0, flow: { nodeId: 'a', side: 'in' as const } },
      { x1: 30, y1: 0, x2: 40, y2: 0, flow: { nodeId: 'a', side: 'out' as const } },
      { x1: 40, y1: 0, x2: 40, y2: 20 }, // vertical link at a T
      { x1: 40, y1: 20, x2: 50, y2: 20, flow: { nodeId: 'b', side: 'in' as const } },
    ];
    const nets = wireNets(wires);
    expect(nets[0]).toEqual([1]);
    expect(nets[3]!.slice().sort()).toEqual([2, 4]);
  });

  it('colours the seal-in branch of the running three-wire demo energised, and the open start branch not', () => {
    const session = createSimulatorSession({ program: threeWireProgram(), panel: builtInPanel('reversing-conveyor')!, scanMs: 10 });
    session.act('S4', 'set', { to: 'RUN' });
    session.press('S2');
    session.advance(5);
    session.release('S2');
    session.advance(5);
    const view = createLiveView(session.simulation!.runtime, session.program);
    const rung = layoutProgram(session.program).rungs[0]!;
    const nets = wireNets(rung.wires);
    const side = (id: string, s: 'in' | 'out') => {
      const live = view.get(id);
      return s === 'in' ? live?.left === true : live?.right === true;
    };
    const energised = rung.wires.map((_, i) => wireEnergised(rung.wires, nets, i, side, () => true));
    const outOf = (id: string) => rung.wires.findIndex((w) => w.flow?.nodeId === id && w.flow.side === 'out');
    expect(energised[outOf('r1n3')]).toBe(false); // Fwd_PB released
    expect(energised[outOf('r1n6')]).toBe(true); // Run_Sel in the seal-in branch
    expect(energised[outOf('r1n8')]).toBe(true); // the K1_Coil coil
    // The lead-in from the left rail joins Stop_PB's input, which is energised.
    expect(energised[0]).toBe(true);
    expect(energised.filter(Boolean).length).toBeGreaterThan(energised.length / 2);
  });
});

describe('live marks painted over the editor drawing', () => {
  it('marks the seal-in rung amber where power passes and grey where it does not', async () => {
    const { liveRungMarks } = await import('@/simulation/livePaint');
    const session = createSimulatorSession({ program: threeWireProgram(), panel: builtInPanel('reversing-conveyor')!, scanMs: 10 });
    session.act('S4', 'set', { to: 'RUN' });
    session.press('S2');
    session.advance(3);
    session.release('S2');
    session.advance(3);
    const layout = layoutProgram(session.program);
    const view = createLiveView(session.simulation!.runtime, session.program);
    const marks = liveRungMarks(layout.rungs[0]!, layout, view);
    const lines = marks.filter((m) => m.kind === 'line');
    expect(lines.some((m) => m.kind === 'line' && m.on && m.flow)).toBe(true);
    expect(lines.some((m) => m.kind === 'line' && !m.on)).toBe(true);
    // Rung 2 (reverse) is not energised past Stop_PB: its coil arcs are grey.
    const reverse = liveRungMarks(layout.rungs[1]!, layout, view).filter((m) => m.kind === 'arc');
    expect(reverse.length).toBe(2);
    expect(reverse.every((m) => m.kind === 'arc' && !m.on)).toBe(true);
    const forwardCoil = marks.filter((m) => m.kind === 'arc');
    expect(forwardCoil.every((m) => m.kind === 'arc' && m.on)).toBe(true);
  });
});
