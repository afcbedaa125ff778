import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { MIN_DRAWER_PX, useDrawerHeight } from '@/components/editor/useDrawerHeight';

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

describe('useDrawerHeight', () => {
  beforeEach(() => vi.stubGlobal('localStorage', memoryStorage()));
  afterEach(() => vi.unstubAllGlobals());

  it('follows the default until the user sets a height', () => {
    expect(useDrawerHeight('workbench').height.value).toBeNull();
  });

  it('keeps the height between its minimum and what leaves the rungs 160 px', () => {
    const drawer = useDrawerHeight('workbench');
    drawer.set(40, 700);
    expect(drawer.height.value).toBe(MIN_DRAWER_PX);
    drawer.set(650, 700);
    expect(drawer.height.value).toBe(540);
    drawer.set(260.4, 700);
    expect(drawer.height.value).toBe(260);
  });

  it('remembers a height per place and forgets it on reset', () => {
    const workbench = useDrawerHeight('workbench');
    workbench.set(260, 800);
    workbench.remember();
    expect(useDrawerHeight('workbench').height.value).toBe(260);
    expect(useDrawerHeight('lab').height.value).toBeNull();
    workbench.reset();
    expect(useDrawerHeight('workbench').height.value).toBeNull();
  });

  it('ignores a stored value that is not a usable height', () => {
    localStorage.setItem('rungwright.drawerHeight.workbench', 'tall');
    expect(useDrawerHeight('workbench').height.value).toBeNull();
    localStorage.setItem('rungwright.drawerHeight.workbench', '3');
    expect(useDrawerHeight('workbench').height.value).toBeNull();
  });
});
