import { describe, expect, it } from 'vitest';
import type { ElementLive } from '@/simulation/liveView';
import { blockFigures, conductorStyle, flowDashOffset, FLOW_DASH } from '@/simulation/useLiveView';
import { createSimulatorSession } from '@/simulation/session';
import { threeWireProgram } from '@/simulation/demoPrograms';
import { createLiveView } from '@/simulation/liveView';
import { builtInPanel } from '@shared/field';
import { LIGHT_PALETTE } from '@/theme';

describe('the live view for the rung canvas', () => {
  it('reports ET against PT for a running timer', () => {
    const session = createSimulatorSession({ program: threeWireProgram(), panel: builtInPanel('reversing-conveyor')!, scanMs: 10 });
    session.act('S4', 'set', { to: 'RUN' });
    session.act('S2', 'press');
    session.act('B1', 'block');
    session.advance(150); // 1.5 s; K1 closes after 25 ms, then the jam timer runs
    const sim = session.simulation!;
    const view = createLiveView(sim.runtime, session.program);
    const timer = session.program.rungs[5]!.network.items[2]!;
    const live = view.get(timer.id)!;
    expect(live.left).toBe(true);
    expect(live.block).toMatchObject({ kind: 'timer', pt: 5000, q: false });
    const et = (live.block as { et: number }).et;
    expect(et).toBeGreaterThan(1400);
    expect(et).toBeLessThan(1500);
    expect(blockFigures(live)).toMatch(/^ET 1\.4\d s \/ PT 5\.00 s$/);
  });

  it('marks a contact on a forced bit as forced', () => {
    const session = createSimulatorSession({ program: threeWireProgram(), panel: builtInPanel('reversing-conveyor')!, scanMs: 10 });
    session.force('Stop_PB', false);
    session.advance(1);
    const live = createLiveView(session.simulation!.runtime, session.program).get('r1n1')!;
    expect(live).toMatchObject({ forced: true, value: false, closed: false, left: true, right: false });
  });

  it('draws energised conductors amber with a flowing dash, de-energised grey, and ink without a simulation', () => {
    const on: ElementLive = { left: true, right: false };
    expect(conductorStyle(on, 'in', LIGHT_PALETTE)).toEqual({ stroke: LIGHT_PALETTE.energised, dash: FLOW_DASH, flowing: true });
    expect(conductorStyle(on, 'out', LIGHT_PALETTE)).toEqual({ stroke: LIGHT_PALETTE.deEnergised, dash: [], flowing: false });
    expect(conductorStyle(null, 'in', LIGHT_PALETTE).stroke).toBe(LIGHT_PALETTE.ink);
    // The dash moves rightwards: its offset decreases with time.
    expect(flowDashOffset(500)).toBeLessThan(flowDashOffset(0));
  });
});
