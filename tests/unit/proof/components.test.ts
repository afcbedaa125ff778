// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { mount, type VueWrapper } from '@vue/test-utils';
import { REVERSING_CONVEYOR } from '@shared/field';
import type { Property, PropertyResult } from '@shared/proof';
import AddProperty from '@/components/proof/AddProperty.vue';
import PropertyRow from '@/components/proof/PropertyRow.vue';

let wrapper: VueWrapper | null = null;
afterEach(() => {
  wrapper?.unmount();
  wrapper = null;
});

const ctx = { panel: REVERSING_CONVEYOR };
const interlock: Property = { never: { '%QX1': true, '%QX2': true } };
const script = { panel: 'reversing-conveyor', scanMs: 10, settleMs: 0, steps: [{ press: 'S2' }, { press: 'S3' }, { wait: 10 }, { expect: { '%QX1': true, '%QX2': true } }] };

describe('a property on the Proof tab', () => {
  it('shows a refuted verdict with its figures and offers to play and keep the counterexample', async () => {
    const result: PropertyResult = { label: '', verdict: 'refuted', states: 14, transitions: 13, depth: 0, ms: 8, counterexample: script };
    wrapper = mount(PropertyRow, { props: { property: interlock, ctx, result } });
    expect(wrapper.find('.title').text()).toBe('K1 and K2 are never commanded together');
    expect(wrapper.find('[data-testid="verdict"]').text()).toBe('Refuted');
    expect(wrapper.find('[data-testid="figures"]').text()).toBe('14 states · 8 ms · counterexample of 4 steps, 10 ms');
    await wrapper.find('[data-testid="play"]').trigger('click');
    await wrapper.find('[data-testid="save-check"]').trigger('click');
    expect(wrapper.emitted('play')).toHaveLength(1);
    expect(wrapper.emitted('save')).toHaveLength(1);
  });

  it('shows a counterexample that did not replay as the prover’s fault, with nothing to play or keep', () => {
    const result: PropertyResult = { label: '', verdict: 'unknown', states: 14, transitions: 13, depth: 1, defect: true, reason: 'defect: the counterexample found did not replay', counterexample: script };
    wrapper = mount(PropertyRow, { props: { property: interlock, ctx, result } });
    expect(wrapper.find('[data-testid="verdict"]').text()).toBe('Prover fault');
    expect(wrapper.find('[data-testid="reason"]').text()).toMatch(/^This is a fault of the prover, not of your program: defect/);
    expect(wrapper.find('[data-testid="play"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="save-check"]').exists()).toBe(false);
  });

  it('says a result is stale and offers to run again; a lab’s property cannot be edited or deleted', async () => {
    const result: PropertyResult = { label: '', verdict: 'proved', states: 134, transitions: 2000, depth: 12, ms: 40 };
    wrapper = mount(PropertyRow, { props: { property: { ...interlock, label: 'the interlock holds' }, ctx, result, stale: true, readonly: true } });
    expect(wrapper.find('.words').text()).toBe('K1 and K2 are never commanded together');
    expect(wrapper.find('[data-testid="stale"]').text()).toMatch(/The program changed after this run/);
    expect(wrapper.findAll('button').map((b) => b.text())).not.toContain('Delete');
    await wrapper.find('[data-testid="stale"] button').trigger('click');
    expect(wrapper.emitted('run')).toHaveLength(1);
  });
});

describe('adding a property', () => {
  it('previews the template in plain words and submits the property', async () => {
    wrapper = mount(AddProperty, { props: { panel: REVERSING_CONVEYOR, tags: [] } });
    expect(wrapper.find('[data-testid="property-preview"]').text()).toBe('Adds: “K1 and K2 are never commanded together”');
    await wrapper.find('[data-testid="property-label"]').setValue('interlock');
    await wrapper.find('form').trigger('submit');
    expect(wrapper.emitted('submit')).toEqual([[{ never: { '%QX1': true, '%QX2': true }, label: 'interlock' }]]);
  });

  it('reads the JSON field as it is typed and refuses to add while it is wrong', async () => {
    wrapper = mount(AddProperty, { props: { panel: REVERSING_CONVEYOR, tags: [] } });
    await wrapper.find('[data-testid="template"]').setValue('json');
    await wrapper.find('[data-testid="property-json"]').setValue('{ "reachable": { "P3": "lit" }, "within": 5 }');
    expect(wrapper.find('[data-testid="property-problems"]').text()).toMatch(/within/);
    await wrapper.find('form').trigger('submit');
    expect(wrapper.emitted('submit')).toBeUndefined();
    await wrapper.find('[data-testid="property-json"]').setValue('{ "reachable": { "P3": "lit" } }');
    expect(wrapper.find('[data-testid="property-preview"]').text()).toBe('Adds: “P3 can be lit”');
    await wrapper.find('form').trigger('submit');
    expect(wrapper.emitted('submit')).toEqual([[{ reachable: { P3: 'lit' } }]]);
  });
});
