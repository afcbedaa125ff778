// @vitest-environment happy-dom
import { beforeEach, describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import PanelView from '@/components/panel/PanelView.vue';
import IoStatusTable from '@/components/panel/IoStatusTable.vue';
import { threeWireProgram } from '@/simulation/demoPrograms';
import { useSimulationStore } from '@/stores/simulation';

function setup() {
  const pinia = createPinia();
  setActivePinia(pinia);
  const store = useSimulationStore();
  store.load(threeWireProgram(), { scanMs: 10 });
  return { store, pinia };
}

/** A key pressed while the field panel has the focus (its keys act only then). */
const key = (type: 'keydown' | 'keyup', k: string, init: KeyboardEventInit = {}) =>
  (document.querySelector('[data-testid="field-panel"]') ?? window).dispatchEvent(new KeyboardEvent(type, { key: k, bubbles: true, ...init }));
const mountPanel = (pinia: ReturnType<typeof createPinia>) => mount(PanelView, { global: { plugins: [pinia] }, attachTo: document.body });
const word = (store: ReturnType<typeof useSimulationStore>, id: string) => store.devices.find((d) => d.id === id)!.word;

describe('the field panel component', () => {
  beforeEach(() => setActivePinia(createPinia()));

  it('draws every device of the layout with an accessible name', () => {
    const { pinia } = setup();
    const wrapper = mount(PanelView, { global: { plugins: [pinia] } });
    for (const id of ['S0', 'S1', 'S2', 'S3', 'S4', 'B1', 'F1', 'K1', 'K2', 'R1', 'H1', 'P1', 'P2', 'P3', 'M1']) {
      const device = wrapper.find(`[data-device="${id}"]`);
      expect(device.exists(), id).toBe(true);
      const named = device.attributes('aria-label') ?? device.find('[aria-label]').attributes('aria-label');
      expect(named, id).toMatch(new RegExp(`^(${id}|Hold|Interlock)`));
    }
    wrapper.unmount();
  });

  it('holds S2 closed while its key is down and lets it go on key-up, after a scan has seen it', async () => {
    const { store, pinia } = setup();
    const wrapper = mountPanel(pinia);
    key('keydown', '2');
    expect(word(store, 'S2')).toBe('pressed');
    store.step();
    key('keyup', '2');
    expect(word(store, 'S2')).toBe('released');
    wrapper.unmount();
  });

  it('pins a pushbutton with Shift and its key, and unpins it the same way', () => {
    const { store, pinia } = setup();
    const wrapper = mountPanel(pinia);
    key('keydown', '3', { shiftKey: true });
    key('keyup', '3', { shiftKey: true });
    store.step();
    expect(word(store, 'S3')).toBe('pressed');
    key('keydown', '3', { shiftKey: true });
    expect(word(store, 'S3')).toBe('released');
    wrapper.unmount();
  });

  it('presses the mouse on a pushbutton: pressed while held, released on pointer-up', async () => {
    const { store, pinia } = setup();
    const wrapper = mount(PanelView, { global: { plugins: [pinia] } });
    const cap = wrapper.find('[data-device="S1"] button.cap');
    await cap.trigger('pointerdown', { button: 0, pointerId: 1 });
    expect(word(store, 'S1')).toBe('pressed');
    store.step();
    await cap.trigger('pointerup', { button: 0, pointerId: 1 });
    expect(word(store, 'S1')).toBe('released');
    wrapper.unmount();
  });

  it('latches the e-stop on its key and resets it on the next press; turns the selector; trips F1', () => {
    const { store, pinia } = setup();
    const wrapper = mountPanel(pinia);
    key('keydown', '0');
    expect(word(store, 'S0')).toBe('pressed');
    key('keydown', '0');
    expect(word(store, 'S0')).toBe('released');
    key('keydown', '4');
    expect(word(store, 'S4')).toBe('RUN');
    key('keydown', 't');
    expect(word(store, 'F1')).toBe('tripped');
    wrapper.unmount();
  });

  it('takes no key while the focus is outside it (on the rungs, where T inserts a TON), and T on it trips F1', () => {
    const { store, pinia } = setup();
    const wrapper = mountPanel(pinia);
    const canvas = document.createElement('div');
    canvas.tabIndex = 0;
    document.body.appendChild(canvas);
    canvas.dispatchEvent(new KeyboardEvent('keydown', { key: 't', bubbles: true }));
    document.body.dispatchEvent(new KeyboardEvent('keydown', { key: '2', bubbles: true }));
    expect([word(store, 'F1'), word(store, 'S2')]).toEqual(['ok', 'released']);
    key('keydown', 't');
    expect(word(store, 'F1')).toBe('tripped');
    canvas.remove();
    wrapper.unmount();
  });

  it('makes F1\'s reset the blue main action only once F1 has tripped', async () => {
    const { store, pinia } = setup();
    const wrapper = mount(PanelView, { global: { plugins: [pinia] } });
    const reset = () => wrapper.find('[data-device="F1"] button.reset');
    expect(reset().classes()).not.toContain('main');
    expect(reset().text()).toMatch(/^Reset F1/);
    store.act('F1', 'trip');
    await wrapper.vm.$nextTick();
    expect(reset().classes()).toContain('main');
    store.act('F1', 'reset');
    await wrapper.vm.$nextTick();
    expect(reset().classes()).not.toContain('main');
    wrapper.unmount();
  });

  it('shows a pressed e-stop latched down with the word LATCHED, and released without it', async () => {
    const { store, pinia } = setup();
    const wrapper = mount(PanelView, { global: { plugins: [pinia] } });
    const estop = () => wrapper.find('[data-device="S0"]');
    expect(estop().classes()).not.toContain('latched');
    expect(estop().find('[data-testid="estop-state"]').text()).toBe('released');
    store.act('S0', 'press');
    await wrapper.vm.$nextTick();
    expect(estop().classes()).toContain('latched');
    expect(estop().find('button.mushroom').classes()).toContain('latched');
    expect(estop().find('button.mushroom').attributes('aria-pressed')).toBe('true');
    expect(estop().find('[data-testid="estop-state"]').text()).toBe('LATCHED');
    wrapper.unmount();
  });

  it('leaves keys typed into a text field alone', () => {
    const { store, pinia } = setup();
    const wrapper = mount(PanelView, { global: { plugins: [pinia] }, attachTo: document.body });
    const input = document.createElement('input');
    document.body.appendChild(input);
    input.dispatchEvent(new KeyboardEvent('keydown', { key: '2', bubbles: true }));
    expect(word(store, 'S2')).toBe('released');
    input.remove();
    wrapper.unmount();
  });
});

describe('the I/O status table', () => {
  it('says why %QX1 is ON while K1 is open when S2 is held on a tripped overload, and forces from a row', async () => {
    const { store, pinia } = setup();
    store.act('S4', 'set', { to: 'RUN' });
    store.press('S2');
    for (let i = 0; i < 5; i += 1) store.step();
    store.release('S2');
    for (let i = 0; i < 60; i += 1) store.step();
    store.act('F1', 'trip');
    // The trip drops K1 and its auxiliary contact breaks the seal; holding S2 commands K1 again.
    store.press('S2');
    for (let i = 0; i < 5; i += 1) store.step();
    const wrapper = mount(IoStatusTable, { global: { plugins: [pinia] } });
    expect(wrapper.find('td[data-reason="%QX1"]').text()).toBe('%QX1 ON, K1 open (F1 95-96 open)');
    expect(wrapper.find('tr[data-address="%QX1"]').classes()).toContain('mismatch');
    await wrapper.find('button[aria-label="Force %QX4 ON"]').trigger('click');
    store.step();
    await wrapper.vm.$nextTick();
    expect(wrapper.find('tr[data-address="%QX4"] .badge').text()).toBe('forced');
    await wrapper.find('button.clear').trigger('click');
    store.step();
    await wrapper.vm.$nextTick();
    expect(wrapper.find('tr[data-address="%QX4"] .badge').exists()).toBe(false);
  });
});
