// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest';
import { defineComponent, h, nextTick, ref } from 'vue';
import { mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { selectElements, selectSlot } from '@/editor/selection';
import { useEditorSurface } from '@/components/editor/useEditorSurface';
import { useEditorStore } from '@/stores/editor';
import { useSimulationStore } from '@/stores/simulation';
import { threeWireProgram } from '@/simulation/demoPrograms';

/** A surface with no canvas or inspector mounted: only its dock tab is looked at. */
function mountSurface() {
  const pinia = createPinia();
  setActivePinia(pinia);
  let surface: ReturnType<typeof useEditorSurface> | null = null;
  const Host = defineComponent({
    setup() {
      surface = useEditorSurface({ canvas: ref(null), inspector: ref(null), effects: { save: () => undefined, toggleMessages: () => undefined }, onSaveKey: () => undefined });
      return () => h('div');
    },
  });
  const wrapper = mount(Host, { global: { plugins: [pinia] } });
  return { wrapper, dockTab: surface!.dockTab, followSimulation: surface!.followSimulation, editor: useEditorStore(), simulation: useSimulationStore() };
}

describe('the dock tab of an editing surface', () => {
  it('opens on the field panel', () => {
    const { wrapper, dockTab } = mountSurface();
    expect(dockTab.value).toBe('panel');
    wrapper.unmount();
  });

  it('turns to the inspector when an element is inserted, so its operand can be typed next', async () => {
    const { wrapper, dockTab, editor } = mountSurface();
    editor.load(threeWireProgram());
    editor.select(selectSlot({ rungId: 'r1', path: [], index: 1 }));
    await nextTick();
    expect(dockTab.value).toBe('panel');
    editor.dispatch('insert-element', { item: 'contact:nc' });
    await nextTick();
    expect(dockTab.value).toBe('inspector');
    wrapper.unmount();
  });

  it('stays on the panel when an element is only selected, or a tag edited', async () => {
    const { wrapper, dockTab, editor } = mountSurface();
    editor.load(threeWireProgram());
    editor.select(selectElements(['r1n3']));
    await nextTick();
    editor.edit((doc) => ({ ...doc, tags: doc.tags.map((t, i) => (i === 0 ? { ...t, comment: 'stop, red' } : t)) }));
    await nextTick();
    expect(dockTab.value).toBe('panel');
    wrapper.unmount();
  });

  it('turns back to the panel when the simulation starts running', async () => {
    const { wrapper, dockTab, followSimulation, editor, simulation } = mountSurface();
    await followSimulation();
    const program = threeWireProgram();
    editor.load(program);
    simulation.load(program);
    dockTab.value = 'inspector';
    simulation.run();
    await nextTick();
    expect(dockTab.value).toBe('panel');
    simulation.pause();
    // The I/O tab is left alone: the student chose to watch the bits.
    dockTab.value = 'io';
    simulation.run();
    await nextTick();
    expect(dockTab.value).toBe('io');
    simulation.pause();
    wrapper.unmount();
  });
});
