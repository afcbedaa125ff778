import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { MIN_CANVAS_PX, MIN_DOCK_PX, useDockWidth } from '@/components/editor/useDockWidth';

/** A Map behind the Storage calls the composable makes. */
function memoryStorage(): Storage {
  const items = new Map<string, string>();
  return {
    getItem: (k: string) => items.get(k) ?? null,
    setItem: (k: string, v: string) => void items.set(k, v),
    removeItem: (k: string) => void items.delete(k),
    clear: () => items.clear(),
    key: (i: number) => [...items.keys()][i] ?? null,
    get length() {
      return items.size;
    },
  };
}

describe('useDockWidth', () => {
  beforeEach(() => vi.stubGlobal('localStorage', memoryStorage()));
  afterEach(() => vi.unstubAllGlobals());

  it('follows the default until the user sets a width', () => {
    expect(useDockWidth('workbench').width.value).toBeNull();
  });

  it('keeps the width between its minimum and what leaves the rungs their room beside the palette', () => {
    const dock = useDockWidth('workbench');
    dock.set(100, 1280, 200);
    expect(dock.width.value).toBe(MIN_DOCK_PX);
    dock.set(2000, 1280, 200);
    expect(dock.width.value).toBe(1280 - 200 - MIN_CANVAS_PX);
    dock.set(412.6, 1280, 200);
    expect(dock.width.value).toBe(413);
  });

  it('never goes below its minimum, even in a frame too narrow for the rungs', () => {
    const dock = useDockWidth('lab');
    dock.set(500, 600, 136);
    expect(dock.width.value).toBe(MIN_DOCK_PX);
  });

  it('remembers a width per place and forgets it on reset', () => {
    const workbench = useDockWidth('workbench');
    workbench.set(420, 1920, 200);
    workbench.remember();
    expect(useDockWidth('workbench').width.value).toBe(420);
    expect(useDockWidth('lab').width.value).toBeNull();
    workbench.reset();
    expect(useDockWidth('workbench').width.value).toBeNull();
  });

  it('ignores a stored value that is not a usable width', () => {
    localStorage.setItem('rungwright.dockWidth.workbench', 'wide');
    expect(useDockWidth('workbench').width.value).toBeNull();
    localStorage.setItem('rungwright.dockWidth.workbench', '40');
    expect(useDockWidth('workbench').width.value).toBeNull();
  });
});
