// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { mount, type VueWrapper } from '@vue/test-utils';
import { nextTick } from 'vue';
import SaveVersionDialog from '@/components/editor/SaveVersionDialog.vue';

/** NModal teleports its card to the body, so the dialog is looked for there. */
function dialog(): HTMLElement | null {
  return document.body.querySelector<HTMLElement>('[role="dialog"]');
}
function messageInput(): HTMLInputElement {
  const input = document.body.querySelector<HTMLInputElement>('input[aria-label="Version message"]');
  if (!input) throw new Error('no "Version message" input in the dialog');
  return input;
}
function button(name: string): HTMLButtonElement {
  const found = [...document.body.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.trim() === name);
  if (!found) throw new Error(`no "${name}" button in the dialog`);
  return found;
}
async function settle(): Promise<void> {
  for (let i = 0; i < 3; i += 1) await nextTick();
}

let wrapper: VueWrapper | null = null;
afterEach(() => {
  wrapper?.unmount();
  wrapper = null;
  document.body.innerHTML = '';
});

describe('the "Save a version" dialog', () => {
  it('hands out the trimmed message and asks to close when submitted', async () => {
    wrapper = mount(SaveVersionDialog, { props: { show: true, errorCount: 0 }, attachTo: document.body });
    await settle();
    expect(dialog()?.textContent).toContain('Save a version');
    const input = messageInput();
    input.value = '  seal-in added  ';
    input.dispatchEvent(new Event('input'));
    await settle();
    button('Save').click();
    await settle();
    expect(wrapper.emitted('save')).toEqual([['seal-in added']]);
    expect(wrapper.emitted('update:show')).toEqual([[false]]);
  });

  it('asks to close without saving on Cancel', async () => {
    wrapper = mount(SaveVersionDialog, { props: { show: true, errorCount: 0 }, attachTo: document.body });
    await settle();
    button('Cancel').click();
    await settle();
    expect(wrapper.emitted('update:show')).toEqual([[false]]);
    expect(wrapper.emitted('save')).toBeUndefined();
  });

  it('notes the error count only while the program has errors', async () => {
    wrapper = mount(SaveVersionDialog, { props: { show: true, errorCount: 2 }, attachTo: document.body });
    await settle();
    expect(dialog()?.textContent).toContain('The program still has 2 errors; you can save it anyway and fix them later.');
    await wrapper.setProps({ errorCount: 1 });
    await settle();
    expect(dialog()?.textContent).toContain('The program still has 1 error; you can');
    await wrapper.setProps({ errorCount: 0 });
    await settle();
    expect(dialog()?.textContent).not.toContain('still has');
  });

  it('starts with an empty message each time it opens', async () => {
    wrapper = mount(SaveVersionDialog, { props: { show: true, errorCount: 0 }, attachTo: document.body });
    await settle();
    const input = messageInput();
    input.value = 'left over';
    input.dispatchEvent(new Event('input'));
    await settle();
    await wrapper.setProps({ show: false });
    await settle();
    await wrapper.setProps({ show: true });
    await settle();
    expect(messageInput().value).toBe('');
  });
});
