/**
 * The height of a workbench's bottom drawer as the user left it, remembered in this browser per
 * place (`key`). `null` means "never resized": the frame's CSS default then follows the window.
 */
import { ref } from 'vue';

const STORAGE_PREFIX = 'rungwright.drawerHeight.';
/** Below this the drawer shows no more than its head and one line; resizing stops there, px. */
export const MIN_DRAWER_PX = 120;
/** The rungs keep at least this much of the window's height, px. */
const MIN_RUNGS_PX = 160;

function readStored(key: string): number | null {
  const saved = Number(globalThis.localStorage?.getItem(STORAGE_PREFIX + key));
  return Number.isFinite(saved) && saved >= MIN_DRAWER_PX ? saved : null;
}

export function useDrawerHeight(key: string) {
  const height = ref<number | null>(readStored(key));

  /** The largest height that still leaves the rungs `MIN_RUNGS_PX` of a frame `frameHeight` tall, px. */
  function maxFor(frameHeight: number): number {
    return Math.max(MIN_DRAWER_PX, frameHeight - MIN_RUNGS_PX);
  }

  function set(px: number, frameHeight: number): void {
    height.value = Math.round(Math.min(maxFor(frameHeight), Math.max(MIN_DRAWER_PX, px)));
  }

  function remember(): void {
    if (height.value === null) globalThis.localStorage?.removeItem(STORAGE_PREFIX + key);
    else globalThis.localStorage?.setItem(STORAGE_PREFIX + key, String(height.value));
  }

  function reset(): void {
    height.value = null;
    remember();
  }

  return { height, maxFor, set, remember, reset };
}
