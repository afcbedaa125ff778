// @vitest-environment happy-dom
/**
 * The palette: an item's tooltip goes as soon as the item is dragged or clicked (none is left over
 * the rungs), and the editor's keys act while the palette has the focus.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { mount, type VueWrapper } from '@vue/test-utils';
import { NTooltip } from 'naive-ui';
import { createPinia, setActivePinia } from 'pinia';
import PalettePanel from '@/components/editor/PalettePanel.vue';
import { selectSlot } from '@/editor/selection';
import { useEditorStore } from '@/stores/editor';
import { program, rung, series } from './fixtures';

let wrapper: VueWrapper | null = null;
beforeEach(() => vi.useFakeTimers());
afterEach(() => {
  wrapper?.unmount();
  vi.useRealTimers();
});

function setup() {
  const pinia = createPinia();
  setActivePinia(pinia);
  const editor = useEditorStore();
  editor.load(program([rung('r1', series('n1'))]));
  editor.select(selectSlot({ rungId: 'r1', path: [], index: 0 }));
  wrapper = mount(PalettePanel, { global: { plugins: [pinia] }, attachTo: document.body });
  const shownTips = () => wrapper!.findAllComponents(NTooltip).filter((t) => t.props('show') === true).length;
  return { editor, shownTips, item: wrapper.find('[data-palette="contact:no"]') };
}

describe('the palette', () => {
  it('shows an item\'s tooltip after the hover delay and drops it when the item is dragged', async () => {
    const { shownTips, item } = setup();
    await item.trigger('mouseenter');
    vi.advanceTimersByTime(450);
    await wrapper!.vm.$nextTick();
    expect(shownTips()).toBe(1);
    await item.trigger('dragstart', { dataTransfer: { setData: () => undefined, effectAllowed: 'copy' } });
    expect(shownTips()).toBe(0);
  });

  it('drops the tooltip on a click, which inserts the item at the selected slot', async () => {
    const { editor, shownTips, item } = setup();
    await item.trigger('mouseenter');
    vi.advanceTimersByTime(450);
    await item.trigger('click');
    expect(shownTips()).toBe(0);
    expect(editor.doc.rungs[0]!.network.items.map((n) => n.kind)).toEqual(['contact']);
  });

  it('takes the editor\'s keys while it has the focus: O after the contact inserts a coil', async () => {
    const { editor, item } = setup();
    await item.trigger('click');
    await item.trigger('keydown', { key: 'o' });
    expect(editor.doc.rungs[0]!.network.items.map((n) => n.kind)).toEqual(['contact', 'coil']);
    // Enter stays the button's own.
    await item.trigger('keydown', { key: 'Enter' });
    expect(editor.doc.rungs[0]!.network.items).toHaveLength(2);
  });
});
