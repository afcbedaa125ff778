// @vitest-environment happy-dom
import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { usePreferencesStore } from '@/stores/preferences';

/** A fresh store as a new page load makes it, reading whatever this browser has saved. */
function freshStore() {
  setActivePinia(createPinia());
  return usePreferencesStore();
}

describe('the folded lab brief', () => {
  beforeEach(() => localStorage.clear());

  it('starts open for everyone', () => {
    expect(freshStore().isBriefCollapsed('user-a')).toBe(false);
  });

  it('is remembered across page loads for the user who folded it, and only for them', () => {
    freshStore().setBriefCollapsed('user-a', true);
    const next = freshStore();
    expect(next.isBriefCollapsed('user-a')).toBe(true);
    expect(next.isBriefCollapsed('user-b')).toBe(false);
    next.setBriefCollapsed('user-a', false);
    expect(freshStore().isBriefCollapsed('user-a')).toBe(false);
  });

  it('reads an unreadable or foreign saved value as nothing saved', () => {
    for (const junk of ['not json', '[true]', '{"user-a":"yes"}', 'null']) {
      localStorage.setItem('rungwright.labBriefCollapsed', junk);
      expect(freshStore().isBriefCollapsed('user-a')).toBe(false);
    }
  });
});
