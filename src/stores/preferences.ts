import { defineStore } from 'pinia';
import { ref, watch } from 'vue';

export type ColorScheme = 'light' | 'dark';

const STORAGE_KEY = 'rungwright.colorScheme';

function initialScheme(): ColorScheme {
  const saved = globalThis.localStorage?.getItem(STORAGE_KEY);
  if (saved === 'light' || saved === 'dark') return saved;
  return globalThis.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
}

/** What the user chose for the look of the app, remembered in this browser. */
export const usePreferencesStore = defineStore('preferences', () => {
  const colorScheme = ref<ColorScheme>(initialScheme());
  watch(colorScheme, (value) => globalThis.localStorage?.setItem(STORAGE_KEY, value));
  function toggleColorScheme(): void {
    colorScheme.value = colorScheme.value === 'light' ? 'dark' : 'light';
  }
  return { colorScheme, toggleColorScheme };
});
