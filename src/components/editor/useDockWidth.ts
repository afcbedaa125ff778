/**
 * The width of a workbench's right dock (the field panel, I/O, inspector, tags) as the user left
 * it, remembered in this browser per place (`key`). `null` means "never resized": the frame's CSS
 * default then gives the dock what the rungs leave (see `WorkbenchFrame.vue`).
 */
import { useRememberedLength } from './useRememberedLength';

const STORAGE_PREFIX = 'rungwright.dockWidth.';
/** The narrowest dock the compact panel still lays out in, px. */
export const MIN_DOCK_PX = 280;
/** The rungs keep at least this much of the frame's width beside the palette, px. */
export const MIN_CANVAS_PX = 320;

export function useDockWidth(key: string) {
  const { length: width, set: setLength, remember, reset } = useRememberedLength(STORAGE_PREFIX + key, MIN_DOCK_PX);

  /** The widest dock that still leaves the rungs `MIN_CANVAS_PX` beside a palette `paletteWidth` wide, px. */
  function maxFor(frameWidth: number, paletteWidth: number): number {
    return Math.max(MIN_DOCK_PX, frameWidth - paletteWidth - MIN_CANVAS_PX);
  }

  function set(px: number, frameWidth: number, paletteWidth: number): void {
    setLength(px, maxFor(frameWidth, paletteWidth));
  }

  return { width, maxFor, set, remember, reset };
}
