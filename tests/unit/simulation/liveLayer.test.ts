import { describe, expect, it } from 'vitest';
import { builtInPanel } from '@shared/field';
import { layoutProgram } from '@/editor/layout';
import { threeWireProgram } from '@/simulation/demoPrograms';
import { liveRungMarks } from '@/simulation/livePaint';
import { createLiveView } from '@/simulation/liveView';
import { createSimulatorSession } from '@/simulation/session';
import { nextPaint } from '@/simulation/useLiveLayer';

function runningForward() {
  const session = createSimulatorSession({ program: threeWireProgram(), panel: builtInPanel('reversing-conveyor')!, scanMs: 10 });
  const layout = layoutProgram(session.program);
  const view = () => createLiveView(session.simulation!.runtime, session.program);
  return { session, layout, view };
}

describe('when the live layer is drawn again', () => {
  it('redraws while a visible conductor is energised, since its dashes flow', () => {
    const { session, layout, view } = runningForward();
    session.advance(2); // at rest: Stop_PB passes power, so the lead-in is energised
    const first = nextPaint([], layout.rungs.slice(0, 2), (r) => liveRungMarks(r, layout, view()));
    expect(first.redraw).toBe(true);
    const again = nextPaint(first.painted, layout.rungs.slice(0, 2), (r) => liveRungMarks(r, layout, view()));
    // Same state: the marks are the previous arrays, but the flow still moves.
    expect(again.painted.map((p) => p.marks)).toEqual(first.painted.map((p) => p.marks));
    expect(again.painted[0]!.marks).toBe(first.painted[0]!.marks);
    expect(again.painted[0]!.flows).toBe(true);
    expect(again.redraw).toBe(true);
    // With reduced motion the dashes stand still, so the same state needs no redraw.
    expect(nextPaint(again.painted, layout.rungs.slice(0, 2), (r) => liveRungMarks(r, layout, view()), false).redraw).toBe(false);
  });

  it('leaves the layer alone when no visible mark changed and nothing flows', () => {
    const { layout } = runningForward();
    const rungs = layout.rungs.slice(5, 6);
    // A block's figures only (a fresh array each refresh, equal in content): nothing to redraw.
    const figures = () => [{ kind: 'text' as const, x: 10, y: 10, text: 'ET 0.00 s / PT 5.00 s', badge: false }];
    const first = nextPaint([], rungs, figures);
    expect(first.redraw).toBe(true);
    expect(nextPaint(first.painted, rungs, figures).redraw).toBe(false);
    const moved = () => [{ kind: 'text' as const, x: 10, y: 10, text: 'ET 0.05 s / PT 5.00 s', badge: false }];
    expect(nextPaint(first.painted, rungs, moved).redraw).toBe(true);
  });

  it('redraws when a rung scrolls in or out of view, and clears the layer when the simulation stops', () => {
    const { session, layout, view } = runningForward();
    session.act('S0', 'press');
    session.advance(2);
    const one = nextPaint([], layout.rungs.slice(4, 5), (r) => liveRungMarks(r, layout, view()));
    const scrolled = nextPaint(one.painted, layout.rungs.slice(5, 6), (r) => liveRungMarks(r, layout, view()));
    expect(scrolled.redraw).toBe(true);
    const stopped = nextPaint(scrolled.painted, layout.rungs.slice(5, 6), null);
    expect(stopped).toEqual({ painted: [], redraw: true });
    expect(nextPaint([], layout.rungs.slice(5, 6), null).redraw).toBe(false);
  });
});
