import { defineStore } from 'pinia';
import { ref, watch } from 'vue';

export type ColorScheme = 'light' | 'dark';

const STORAGE_KEY = 'rungwright.colorScheme';
/** Per user id: whether they keep a lab's brief column folded away. */
const BRIEF_KEY = 'rungwright.labBriefCollapsed';

function initialScheme(): ColorScheme {
  const saved = globalThis.localStorage?.getItem(STORAGE_KEY);
  if (saved === 'light' || saved === 'dark') return saved;
  return globalThis.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
}

/** The saved map, or an empty one when nothing (or something unreadable) is stored. */
function initialBriefCollapsed(): Record<string, boolean> {
  try {
    const saved: unknown = JSON.parse(globalThis.localStorage?.getItem(BRIEF_KEY) ?? '{}');
    if (typeof saved !== 'object' || saved === null || Array.isArray(saved)) return {};
    return Object.fromEntries(Object.entries(saved).filter((entry): entry is [string, boolean] => typeof entry[1] === 'boolean'));
  } catch {
    return {};
  }
}

/** What the user chose for the look of the app, remembered in this browser. */
export const usePreferencesStore = defineStore('preferences', () => {
  const colorScheme = ref<ColorScheme>(initialScheme());
  watch(colorScheme, (value) => globalThis.localStorage?.setItem(STORAGE_KEY, value));
  function toggleColorScheme(): void {
    colorScheme.value = colorScheme.value === 'light' ? 'dark' : 'light';
  }

  // Several people may share a lab computer's browser, so the choice is kept per signed-in user.
  const briefCollapsedBy = ref<Record<string, boolean>>(initialBriefCollapsed());
  function isBriefCollapsed(userId: string): boolean {
    return briefCollapsedBy.value[userId] === true;
  }
  function setBriefCollapsed(userId: string, collapsed: boolean): void {
    briefCollapsedBy.value = { ...briefCollapsedBy.value, [userId]: collapsed };
    globalThis.localStorage?.setItem(BRIEF_KEY, JSON.stringify(briefCollapsedBy.value));
  }

  return { colorScheme, toggleColorScheme, briefCollapsedBy, isBriefCollapsed, setBriefCollapsed };
});
