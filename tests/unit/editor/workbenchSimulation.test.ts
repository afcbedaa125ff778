/**
 * The editor and the simulation together (`useWorkbenchSimulation`): the simulation gets only
 * documents that compile, so typing an operand piles up no "cannot run" notes; one status says
 * where the document on screen stands; a new program's panel is there before its first rung.
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { effectScope, nextTick } from 'vue';
import { createPinia, setActivePinia } from 'pinia';
import { builtInPanel } from '@shared/field/panels';
import { createEmptyProgram } from '@shared/ladder/restore';
import { replayableScript } from '@/components/labs/replay';
import { setOperand } from '@shared/ladder/edits';
import type { Program } from '@shared/ladder/schema';
import { useWorkbenchSimulation } from '@/components/editor/useWorkbenchSimulation';
import { useEditorStore } from '@/stores/editor';
import { useSimulationStore } from '@/stores/simulation';
import { coil, no, program, rung, series } from './fixtures';

const PANEL = builtInPanel('reversing-conveyor')!;
const sealIn = () =>
  program([rung('r1', series('n1', no('stop', '%IX1'), no('start', '%IX2'), coil('k1', '%QX1')))], [{ name: 'Stop_PB', address: '%IX1', comment: 'S1' }]);

/** The composable as the dock runs it, with the dock's simulation (which loads what it is given, then recompiles edits). */
function setup(doc: Program) {
  const editor = useEditorStore();
  const simulation = useSimulationStore();
  editor.load(doc);
  const scope = effectScope();
  const bench = scope.run(() => useWorkbenchSimulation(() => PANEL))!;
  simulation.load(bench.runnable.value, { panel: PANEL });
  // What SimulationDock does with its `program` prop after each edit.
  const feed = () => simulation.setProgram(bench.runnable.value);
  return { editor, simulation, bench, feed };
}

beforeEach(() => setActivePinia(createPinia()));

describe('the workbench simulation', () => {
  it('keeps no note per keystroke while an operand is typed, and says the current state only', async () => {
    const { editor, simulation, bench, feed } = setup(sealIn());
    expect(bench.status.value).toEqual({ kind: 'compiles' });
    for (const typed of ['%', '%Q', '%QX', '%QX9', '%QX2']) {
      editor.edit((doc) => setOperand(doc, { elementId: 'k1', operand: typed }), 'operand:k1');
      await nextTick();
      feed();
      if (typed !== '%QX2') {
        expect(bench.status.value.kind).toBe('error');
        // The panel still has the last version that compiled; nothing claims it runs while stopped.
        expect(bench.runnable.value.rungs[0]!.network.items[2]).toMatchObject({ operand: '%QX1' });
      }
    }
    expect(bench.status.value).toEqual({ kind: 'compiles' });
    expect(simulation.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(simulation.messages.map((m) => m.text).join(' ')).not.toMatch(/still running|while running|Cannot run/);
    expect(simulation.program).toBe(editor.doc);
  });

  it('names the first error and its element while the document does not compile', () => {
    const { editor, bench } = setup(sealIn());
    editor.edit((doc) => setOperand(doc, { elementId: 'start', operand: '%IX99' }));
    const status = bench.status.value;
    if (status.kind !== 'error') throw new Error(`expected an error, got ${status.kind}`);
    expect(status.first).toMatchObject({ code: 'address-out-of-range', elementId: 'start' });
    expect(status.count).toBe(1);
    expect(status.held).toBe(true);
  });

  it('shows a new program\'s panel and I/O table before its first rung compiles, with no error', () => {
    const { simulation, bench } = setup({ ...createEmptyProgram('Fresh'), tags: [{ name: 'Stop_PB', address: '%IX1', comment: '' }] });
    expect(bench.status.value).toEqual({ kind: 'blank' });
    expect(bench.runnable.value.rungs).toEqual([]);
    expect(simulation.simulation).not.toBeNull();
    expect(simulation.devices.map((d) => d.id)).toContain('S2');
    expect(simulation.io?.inputs.map((r) => r.address)).toEqual(['%IX1', '%IX2', '%IX3', '%IX4', '%IX5', '%IX6', '%IX7', '%IX8']);
    expect(simulation.program?.tags.map((t) => t.name)).toEqual(['Stop_PB']);
    expect(simulation.messages).toEqual([]);
  });

  it('replays a check only on a document that compiles', () => {
    const { editor, bench } = setup(sealIn());
    const script = replayableScript({ panel: 'reversing-conveyor', scanMs: 10, steps: [{ wait: 50 }, { expect: { K1: 'open' }, label: 'at rest' }] })!;
    const replayed = bench.replay(script, 2);
    if ('error' in replayed) throw new Error(replayed.error);
    expect(replayed.virtualMs).toBe(script.settleMs + 50);
    editor.edit((doc) => setOperand(doc, { elementId: 'start', operand: '%IX99' }));
    expect(bench.replay(script, 2)).toEqual({ error: expect.stringMatching(/does not compile/) });
  });
});

describe('the simulation store', () => {
  it('does not say "recompiled while running" for an edit made while stopped, and does once it has run', () => {
    const simulation = useSimulationStore();
    const doc = sealIn();
    simulation.load(doc, { panel: PANEL });
    simulation.setProgram(setOperand(doc, { elementId: 'k1', operand: '%QX2' }));
    expect(simulation.messages).toEqual([]);
    simulation.step();
    simulation.setProgram(setOperand(doc, { elementId: 'k1', operand: '%QX3' }));
    expect(simulation.messages.map((m) => m.text)).toEqual([expect.stringMatching(/^Recompiled while running/)]);
  });
});
