/**
 * Read-through caches for the rows nearly every request reads: the signed-in user, a program, and
 * an immutable program version. On PGlite one query costs 0.3–0.9 ms of this process's CPU
 * (measured), so without them a program load spent most of its time re-reading rows that had not
 * changed.
 *
 * Why a cached row is never stale: PGlite lives inside this process, and the server holds an
 * exclusive lock on DATA_DIR, so no other process can write the database. Every write to a cached
 * table goes through the db-layer function that owns it, which replaces or drops the cached row
 * once its statement has committed. A read that began before such a write could still finish
 * after it with the old row; a generation counter, bumped by every write, keeps that row out.
 * A database shared by several server processes (a PostgreSQL server) must not enable these
 * caches: another process's write would not reach them.
 *
 * Only handles registered by `enableRowCaches` (the database's root handle) use a cache: a
 * transaction's handle is a different object and always reads the database.
 */
import type { ProgramRow, ProgramVersionRow, User } from './schema';

/**
 * A bounded map, least recently used entry dropped first. Each row is frozen, so no caller can
 * change a shared row (a version's document is kept as text, see `CachedVersionRow`).
 */
export class RowCache<V> {
  private readonly entries = new Map<string, V>();
  private generation = 0;

  constructor(private readonly capacity: number) {}

  /** The cached value, or the loaded one (cached unless a write happened while it loaded). */
  async read(key: string, load: () => Promise<V | null>): Promise<V | null> {
    const hit = this.entries.get(key);
    if (hit !== undefined) {
      this.entries.delete(key);
      this.entries.set(key, hit);
      return hit;
    }
    const generation = this.generation;
    const loaded = await load();
    if (loaded !== null && generation === this.generation) this.store(key, loaded);
    return loaded;
  }

  /** The cached value without loading (and without counting as a use). */
  peek(key: string): V | undefined {
    return this.entries.get(key);
  }

  /** After a committed write: the row as it now is in the database. */
  put(key: string, value: V): V {
    this.generation += 1;
    this.store(key, value);
    return value;
  }

  /** After a committed write whose result is not at hand (or a delete). */
  drop(key: string): void {
    this.generation += 1;
    this.entries.delete(key);
  }

  /** Drops every key `matches` accepts (e.g. all versions of a deleted program). */
  dropWhere(matches: (key: string) => boolean): void {
    this.generation += 1;
    for (const key of [...this.entries.keys()]) if (matches(key)) this.entries.delete(key);
  }

  /** After a write that may have changed any row (a cascade from another table). */
  clear(): void {
    this.generation += 1;
    this.entries.clear();
  }

  get size(): number {
    return this.entries.size;
  }

  private store(key: string, value: V): void {
    this.entries.delete(key);
    this.entries.set(key, Object.freeze(value));
    if (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value as string);
  }
}

/**
 * A version row as the cache keeps it: the document as its JSON text (`JSON.stringify` of the
 * document, the bytes an answer sends), not as an object tree. Every save caches the version it
 * wrote; as a tree of about a thousand objects each such document outlived the young generation
 * and was copied into the old one, which made each scavenge under a stream of saves 15–20 ms
 * (`--trace-gc`); one string is one object to copy. Answers splice the text in; the few readers
 * that need the tree parse it.
 */
export type CachedVersionRow = Omit<ProgramVersionRow, 'document'> & { documentJson: string };

/** The caches of one database; capacities bound memory (a version holds a whole document, a few kB to ~1 MB). */
export interface RowCaches {
  users: RowCache<User>;
  programs: RowCache<ProgramRow>;
  /** Keyed by `versionKey`. */
  versions: RowCache<CachedVersionRow>;
}

export const versionKey = (programId: string, number: number): string => `${programId}#${number}`;

const cachesByHandle = new WeakMap<object, RowCaches>();

/** Turns the caches on for a database handle this process alone can write (see above). */
export function enableRowCaches(handle: object): RowCaches {
  const caches: RowCaches = { users: new RowCache(2_000), programs: new RowCache(2_000), versions: new RowCache(500) };
  cachesByHandle.set(handle, caches);
  return caches;
}

/** The caches of `handle`, or undefined (a transaction, or a database without them). */
export function rowCachesOf(handle: object): RowCaches | undefined {
  return cachesByHandle.get(handle);
}

type CachedRow<C extends keyof RowCaches> = RowCaches[C] extends RowCache<infer V> ? V : never;

/** Reads `key` through cache `cache` of `handle` when it has one; otherwise just loads. */
export function readThrough<C extends keyof RowCaches>(handle: object, cache: C, key: string, load: () => Promise<CachedRow<C> | null>): Promise<CachedRow<C> | null> {
  const caches = cachesByHandle.get(handle);
  return caches ? (caches[cache] as unknown as RowCache<CachedRow<C>>).read(key, load) : load();
}
