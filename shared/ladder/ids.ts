/**
 * Stable ids. Every rung and network node carries an id unique within the program; new ones are
 * the smallest unused `prefix + n` (n from 1), so the same edits on the same document always give
 * the same ids — no clock, no randomness.
 */
import type { NetworkNode, Program } from './schema';
import { allIds } from './walk';

/** The prefix new ids get, by what they name. */
export const ID_PREFIX = {
  rung: 'rung',
  series: 'ser',
  parallel: 'par',
  contact: 'con',
  coil: 'coil',
  block: 'blk',
} as const satisfies Record<NetworkNode['kind'] | 'rung', string>;

/** Hands out ids unused in a set of taken ids, remembering the ones it gave. */
export interface IdSource {
  next(prefix: string): string;
  /** Mark an id as taken; false when it already was. */
  claim(id: string): boolean;
  has(id: string): boolean;
}

/** An id source over a set of taken ids. */
export function createIdSource(taken: Iterable<string>): IdSource {
  const used = new Set(taken);
  return {
    next(prefix) {
      let n = 1;
      while (used.has(`${prefix}${n}`)) n += 1;
      const id = `${prefix}${n}`;
      used.add(id);
      return id;
    },
    claim(id) {
      if (used.has(id)) return false;
      used.add(id);
      return true;
    },
    has: (id) => used.has(id),
  };
}

/** The smallest unused `prefix + n` in the program (n from 1). */
export function freshId(program: Program, prefix: string): string {
  return createIdSource(allIds(program)).next(prefix);
}
