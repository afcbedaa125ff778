/**
 * Structural sharing for views recomputed on every refresh: a new value that equals the previous
 * one (deeply, for the plain data these views are made of) is replaced by the previous object, so
 * Vue sees the same reference and skips re-rendering the component that shows it.
 */

/** Deep equality of plain JSON-like data (objects, arrays, primitives). */
export function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const bb = b as unknown[];
    return a.length === bb.length && a.every((x, i) => sameData(x, bb[i]));
  }
  const ka = Object.keys(a);
  const kb = Object.keys(b);
  if (ka.length !== kb.length) return false;
  return ka.every((k) => sameData((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}

/** Each item of `next` that equals the item of `previous` with the same key is replaced by that item. */
export function shareByKey<T>(previous: readonly T[] | null, next: T[], key: (item: T) => string): T[] {
  if (previous === null || previous.length === 0) return next;
  const old = new Map(previous.map((item) => [key(item), item] as const));
  let changed = previous.length !== next.length;
  const out = next.map((item, i) => {
    const before = old.get(key(item));
    if (before !== undefined && sameData(before, item)) {
      if (previous[i] !== before) changed = true;
      return before;
    }
    changed = true;
    return item;
  });
  return changed ? out : (previous as T[]);
}
