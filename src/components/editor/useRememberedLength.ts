/**
 * A length the user set by dragging a handle (a drawer's height, a dock's width), remembered in
 * this browser under `storageKey`. `null` means "never set": the page's CSS default then follows
 * the window. Shared by `useDrawerHeight` and `useDockWidth`.
 */
import { ref } from 'vue';

function readStored(storageKey: string, minPx: number): number | null {
  const saved = Number(globalThis.localStorage?.getItem(storageKey));
  return Number.isFinite(saved) && saved >= minPx ? saved : null;
}

export function useRememberedLength(storageKey: string, minPx: number) {
  const length = ref<number | null>(readStored(storageKey, minPx));

  /** Sets the length, whole pixels, kept between `minPx` and `maxPx` (the minimum wins when the room is smaller). */
  function set(px: number, maxPx: number): void {
    length.value = Math.round(Math.min(Math.max(minPx, maxPx), Math.max(minPx, px)));
  }

  function remember(): void {
    if (length.value === null) globalThis.localStorage?.removeItem(storageKey);
    else globalThis.localStorage?.setItem(storageKey, String(length.value));
  }

  function reset(): void {
    length.value = null;
    remember();
  }

  return { length, set, remember, reset };
}
