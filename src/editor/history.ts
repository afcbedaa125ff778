/**
 * Undo and redo over whole document snapshots (STYLE.md point 5): the one place that records
 * history; no command writes its own undo. Documents are immutable and edits share unchanged parts,
 * so a snapshot costs only what changed. Each entry also keeps the selection it was made with, so
 * undo puts the selection back where the change happened.
 */

/** One remembered state. */
export interface Snapshot<D, S> {
  doc: D;
  selection: S;
}

/** Past and future around the present state. */
export interface History<D, S> {
  past: readonly Snapshot<D, S>[];
  present: Snapshot<D, S>;
  future: readonly Snapshot<D, S>[];
  /**
   * Set by a commit that may be merged with the next one of the same key (typing in an operand
   * field is one entry, not one per key press).
   */
  coalesceKey: string | null;
}

/** How many undo steps are kept. */
export const HISTORY_LIMIT = 200;

/** A history holding only the present. */
export function createHistory<D, S>(doc: D, selection: S): History<D, S> {
  return { past: [], present: { doc, selection }, future: [], coalesceKey: null };
}

/**
 * Record a new present. The same document object means nothing changed: the history stays as it
 * was. With a `coalesceKey` equal to the previous commit's, the present is replaced instead of
 * pushed, so a burst of small edits undoes in one step.
 */
export function commit<D, S>(history: History<D, S>, doc: D, selection: S, coalesceKey: string | null = null): History<D, S> {
  if (doc === history.present.doc) return history;
  const next = { doc, selection };
  if (coalesceKey !== null && coalesceKey === history.coalesceKey) {
    return { ...history, present: next, future: [] };
  }
  const past = [...history.past, history.present].slice(-HISTORY_LIMIT);
  return { past, present: next, future: [], coalesceKey };
}

/** Keep the document, change the remembered selection (selection moves are not undo steps). */
export function withSelection<D, S>(history: History<D, S>, selection: S): History<D, S> {
  return { ...history, present: { ...history.present, selection } };
}

export function canUndo<D, S>(history: History<D, S>): boolean {
  return history.past.length > 0;
}

export function canRedo<D, S>(history: History<D, S>): boolean {
  return history.future.length > 0;
}

/** Step back; the same history when there is nothing to undo. */
export function undo<D, S>(history: History<D, S>): History<D, S> {
  const previous = history.past[history.past.length - 1];
  if (!previous) return history;
  return {
    past: history.past.slice(0, -1),
    present: previous,
    future: [history.present, ...history.future],
    coalesceKey: null,
  };
}

/** Step forward again; the same history when there is nothing to redo. */
export function redo<D, S>(history: History<D, S>): History<D, S> {
  const [next, ...rest] = history.future;
  if (!next) return history;
  return { past: [...history.past, history.present], present: next, future: rest, coalesceKey: null };
}

/** Forget everything before the present (a freshly loaded document). */
export function resetHistory<D, S>(doc: D, selection: S): History<D, S> {
  return createHistory(doc, selection);
}
