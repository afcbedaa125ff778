/**
 * The height of a workbench's bottom drawer as the user left it, remembered in this browser per
 * place (`key`). `null` means "never resized": the frame's CSS default then follows the window.
 */
import { useRememberedLength } from './useRememberedLength';

const STORAGE_PREFIX = 'rungwright.drawerHeight.';
/** Below this the drawer shows no more than its head and one line; resizing stops there, px. */
export const MIN_DRAWER_PX = 120;
/** The rungs keep at least this much of the window's height, px. */
const MIN_RUNGS_PX = 160;

export function useDrawerHeight(key: string) {
  const { length: height, set: setLength, remember, reset } = useRememberedLength(STORAGE_PREFIX + key, MIN_DRAWER_PX);

  /** The largest height that still leaves the rungs `MIN_RUNGS_PX` of a frame `frameHeight` tall, px. */
  function maxFor(frameHeight: number): number {
    return Math.max(MIN_DRAWER_PX, frameHeight - MIN_RUNGS_PX);
  }

  function set(px: number, frameHeight: number): void {
    setLength(px, maxFor(frameHeight));
  }

  return { height, maxFor, set, remember, reset };
}
