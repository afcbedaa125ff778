/**
 * naive-ui's dark theme carries every component's dark variables (some 170 modules). It is loaded
 * in a chunk of its own when the dark scheme is first on, rather than evaluated on every page load.
 */
import { shallowRef } from 'vue';
import type { GlobalTheme } from 'naive-ui';

/** The dark theme once loaded; `null` until then. */
export const darkTheme = shallowRef<GlobalTheme | null>(null);

let loading: Promise<void> | null = null;

/** Load the dark theme (once); resolves when `darkTheme` holds it. */
export function loadDarkTheme(): Promise<void> {
  loading ??= import('./naiveDarkTheme').then((module) => {
    darkTheme.value = module.darkTheme;
  });
  return loading;
}
