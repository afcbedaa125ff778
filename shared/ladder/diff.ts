/**
 * Rung-by-rung difference of two versions of a program, matched by rung id and compared through
 * the text form (so a renamed tag shows as changed text) and the rung comment. Used by the server's
 * version history.
 */
import { createNameView } from './names';
import type { Program, Rung } from './schema';
import { rungText } from './text';

/** One rung's fate between two versions. */
export interface RungDiff {
  kind: 'added' | 'removed' | 'changed' | 'same';
  rungId: string;
  /** Text form in the first version (absent when added). */
  before?: string;
  /** Text form in the second version (absent when removed). */
  after?: string;
  /** Rung comments, when either version has one. */
  beforeComment?: string;
  afterComment?: string;
  /** For a changed rung: what changed, so a comment-only change does not read as two equal texts. */
  changedParts?: RungPart[];
}

/** The parts of a rung a diff tells apart: its logic (the text form) and its comment. */
export type RungPart = 'logic' | 'comment';

/**
 * Compare `a` (older) with `b` (newer). Rungs come in `b`'s order; a removed rung is listed where
 * it stood in `a`, after the rungs that preceded it there.
 */
export function diffPrograms(a: Program, b: Program): RungDiff[] {
  const namesA = createNameView(a);
  const namesB = createNameView(b);
  const inA = new Map(a.rungs.map((rung, index) => [rung.id, { rung, index }]));
  const inB = new Set(b.rungs.map((rung) => rung.id));
  const result: RungDiff[] = [];
  let nextA = 0;

  const flushRemovedUpTo = (limit: number): void => {
    for (; nextA < limit; nextA += 1) {
      const rung = a.rungs[nextA]!;
      if (!inB.has(rung.id)) result.push(withComments({ kind: 'removed', rungId: rung.id, before: rungText(rung, namesA) }, rung, undefined));
    }
  };

  for (const rung of b.rungs) {
    const old = inA.get(rung.id);
    const after = rungText(rung, namesB);
    if (old === undefined) {
      result.push(withComments({ kind: 'added', rungId: rung.id, after }, undefined, rung));
      continue;
    }
    flushRemovedUpTo(old.index);
    nextA = Math.max(nextA, old.index + 1);
    const before = rungText(old.rung, namesA);
    const parts: RungPart[] = [];
    if (before !== after) parts.push('logic');
    if (old.rung.comment !== rung.comment) parts.push('comment');
    const diff: RungDiff = parts.length === 0 ? { kind: 'same', rungId: rung.id, before, after } : { kind: 'changed', rungId: rung.id, before, after, changedParts: parts };
    result.push(withComments(diff, old.rung, rung));
  }
  flushRemovedUpTo(a.rungs.length);
  return result;
}

function withComments(diff: RungDiff, before: Rung | undefined, after: Rung | undefined): RungDiff {
  if (before?.comment) diff.beforeComment = before.comment;
  if (after?.comment) diff.afterComment = after.comment;
  return diff;
}
