// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { mount, type VueWrapper } from '@vue/test-utils';
import { createPinia } from 'pinia';
import { defineComponent, h, nextTick, ref } from 'vue';
import DockTabs from '@/components/editor/DockTabs.vue';
import type { DockTab } from '@/components/editor/useEditorSurface';

let wrapper: VueWrapper | null = null;
afterEach(() => {
  wrapper?.unmount();
  wrapper = null;
  document.body.innerHTML = '';
});

/** The dock's tabs around plain panes, the shown tab held by the test as the workbench holds it. */
function mountTabs(start: DockTab = 'panel') {
  const shown = ref<DockTab>(start);
  const Host = defineComponent({
    setup: () => () =>
      h(
        DockTabs,
        { value: shown.value, 'onUpdate:value': (v: DockTab) => (shown.value = v) },
        {
          panel: () => h('p', { class: 'panel-pane' }, 'field panel'),
          inspector: () => h('p', { class: 'inspector-pane' }, 'inspector'),
          tags: () => h('p', { class: 'tags-pane' }, 'tags'),
          proof: () => h('p', { class: 'proof-pane' }, 'proof'),
        },
      ),
  });
  wrapper = mount(Host, { global: { plugins: [createPinia()], stubs: { IoStatusTable: { template: '<p class="io-pane">I/O</p>' } } }, attachTo: document.body });
  return { shown, tabs: () => wrapper!.findAll('[role="tab"]') };
}

describe('the dock\'s tabs', () => {
  it('are a tablist of five tabs, the shown one selected and the only tab stop, each controlling a pane named by it', () => {
    const { tabs } = mountTabs('inspector');
    expect(wrapper!.find('[role="tablist"]').exists()).toBe(true);
    expect(tabs().map((t) => t.text())).toEqual(['Panel', 'I/O', 'Inspector', 'Tags', 'Proof']);
    expect(tabs().map((t) => t.attributes('aria-selected'))).toEqual(['false', 'false', 'true', 'false', 'false']);
    expect(tabs().map((t) => t.attributes('tabindex'))).toEqual(['-1', '-1', '0', '-1', '-1']);
    const inspector = tabs()[2]!;
    const pane = wrapper!.find(`#${inspector.attributes('aria-controls')}`);
    expect(pane.attributes('role')).toBe('tabpanel');
    expect(pane.attributes('aria-labelledby')).toBe(inspector.attributes('id'));
    expect(pane.isVisible()).toBe(true);
    // The panel stays mounted while hidden (its held buttons and keys), the I/O pane does not.
    expect(wrapper!.find('.panel-pane').exists()).toBe(true);
    expect(wrapper!.find('.panel-pane').isVisible()).toBe(false);
    expect(wrapper!.find('.io-pane').exists()).toBe(false);
  });

  it('shows the pane of a clicked tab and gives the underline (the active class) to that tab alone', async () => {
    const { shown, tabs } = mountTabs('inspector');
    await tabs()[0]!.trigger('click');
    expect(shown.value).toBe('panel');
    expect(tabs().filter((t) => t.classes('active')).map((t) => t.text())).toEqual(['Panel']);
    expect(wrapper!.find('.panel-pane').isVisible()).toBe(true);
    // Turned from outside (an insertion turns the dock to the inspector): the underline follows.
    shown.value = 'inspector';
    await nextTick();
    expect(tabs().filter((t) => t.classes('active')).map((t) => t.text())).toEqual(['Inspector']);
  });

  it('moves with the arrow keys (wrapping), Home and End, and takes the focus along', async () => {
    const { shown, tabs } = mountTabs('panel');
    const list = wrapper!.find('[role="tablist"]');
    await list.trigger('keydown', { key: 'ArrowLeft' });
    expect(shown.value).toBe('proof');
    await list.trigger('keydown', { key: 'ArrowRight' });
    expect(shown.value).toBe('panel');
    await list.trigger('keydown', { key: 'End' });
    expect(shown.value).toBe('proof');
    await list.trigger('keydown', { key: 'Home' });
    await list.trigger('keydown', { key: 'ArrowRight' });
    expect(shown.value).toBe('io');
    await nextTick();
    expect(document.activeElement).toBe(tabs()[1]!.element);
    await list.trigger('keydown', { key: 'x' });
    expect(shown.value).toBe('io');
  });

  it('mounts the proof pane the first time its tab is shown and keeps it while another tab shows (its run and results stay)', async () => {
    const { shown } = mountTabs('panel');
    expect(wrapper!.find('.proof-pane').exists()).toBe(false);
    shown.value = 'proof';
    await nextTick();
    expect(wrapper!.find('.proof-pane').isVisible()).toBe(true);
    shown.value = 'tags';
    await nextTick();
    expect(wrapper!.find('.proof-pane').exists()).toBe(true);
    expect(wrapper!.find('.proof-pane').isVisible()).toBe(false);
  });
});
