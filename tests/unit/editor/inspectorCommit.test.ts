// @vitest-environment happy-dom
/**
 * The inspector commits an operand on Enter, on leaving the field or after a short pause, not at
 * every key: half-typed operands ("%", "%Q") never reach the document, and the word typed is one
 * undo step. A suggestion picked goes in at once, as its value (not its description).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { mount, type VueWrapper } from '@vue/test-utils';
import { nextTick } from 'vue';
import { NAutoComplete } from 'naive-ui';
import { createPinia, setActivePinia } from 'pinia';
import { builtInPanel } from '@shared/field/panels';
import { conveyorTags } from '@shared/labs/conveyorTags';
import { findElement } from '@shared/ladder/walk';
import InspectorPanel from '@/components/editor/InspectorPanel.vue';
import { selectElements } from '@/editor/selection';
import { useEditorStore } from '@/stores/editor';
import { coil, no, program, rung, series } from './fixtures';

let wrapper: VueWrapper | null = null;
beforeEach(() => {
  setActivePinia(createPinia());
  vi.useFakeTimers();
});
afterEach(() => {
  wrapper?.unmount();
  wrapper = null;
  vi.useRealTimers();
  document.body.innerHTML = '';
});

async function openOn(elementId: string) {
  const pinia = createPinia();
  setActivePinia(pinia);
  const editor = useEditorStore();
  editor.usePanel(builtInPanel('reversing-conveyor')!);
  editor.load(program([rung('r1', series('n', no('c', 'Stop_PB'), coil('k', '')))], conveyorTags()));
  editor.select(selectElements([elementId]));
  wrapper = mount(InspectorPanel, { global: { plugins: [pinia] }, attachTo: document.body });
  await nextTick();
  const input = wrapper.find('input[aria-label="Operand"]');
  const operand = () => {
    const found = findElement(editor.doc, elementId)!.element;
    return found.kind === 'block' ? '' : found.operand;
  };
  const type = async (text: string) => {
    (input.element as HTMLInputElement).value = text;
    await input.trigger('input');
  };
  return { editor, input, operand, type };
}

describe('the inspector\'s operand field', () => {
  it('commits after a pause, not at every key, as one undo step', async () => {
    const { editor, operand, type } = await openOn('k');
    const start = editor.doc;
    for (const text of ['%', '%Q', '%QX', '%QX5']) {
      await type(text);
      vi.advanceTimersByTime(100);
    }
    expect(editor.doc).toBe(start);
    vi.advanceTimersByTime(500);
    expect(operand()).toBe('%QX5');
    editor.undo();
    expect(editor.doc).toBe(start);
  });

  it('commits at once on Enter', async () => {
    const { operand, type, input } = await openOn('k');
    await type('%QX4');
    expect(operand()).toBe('');
    await input.trigger('keydown', { key: 'Enter' });
    expect(operand()).toBe('%QX4');
    expect(wrapper!.emitted('done')).toHaveLength(1);
  });

  it('commits when the selection moves to another element', async () => {
    const { editor, type } = await openOn('k');
    await type('Horn');
    editor.select(selectElements(['c']));
    await nextTick();
    expect(findElement(editor.doc, 'k')!.element).toMatchObject({ operand: 'Horn' });
  });

  it('offers a coil the outputs by their devices, and a pick puts the value (not its description) in the document', async () => {
    const { operand } = await openOn('k');
    const field = wrapper!.findComponent(NAutoComplete);
    const options = field.props('options') as { value: string; label: string; description: string }[];
    const render = field.props('renderLabel') as (o: unknown) => string;
    expect(options.slice(0, 2).map(render)).toEqual(['K1_Coil — %QX1 · K1 forward contactor coil', 'K2_Coil — %QX2 · K2 reverse contactor coil']);
    expect(options.slice(0, 2).map((o) => [o.value, o.label])).toEqual([['K1_Coil', 'K1_Coil'], ['K2_Coil', 'K2_Coil']]);
    expect(options.some((o) => o.value === 'Fwd_PB')).toBe(false);
    // naive-ui on a pick: `select` with the value, then the field's value set to the option's label.
    field.vm.$emit('select', 'Green_Lamp');
    field.vm.$emit('update:value', 'Green_Lamp');
    expect(operand()).toBe('Green_Lamp');
    vi.advanceTimersByTime(1000);
    expect(operand()).toBe('Green_Lamp');
  });
});
