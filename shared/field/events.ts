/**
 * The per-scan event log of a simulation: what happened on the panel, with the reason in words a
 * student understands ("K1 dropped out: F1 95-96 opened").
 */

/** What an event is about. */
export type FieldEventKind =
  | 'action'
  | 'refused'
  | 'contactor'
  | 'interlock'
  | 'overload'
  | 'motor'
  | 'lamp'
  | 'horn'
  | 'fault';

export interface FieldEvent {
  /** Counts every event ever logged by this simulation, from 0 (also those no longer kept). */
  readonly seq: number;
  /** Virtual time in ms when it happened (end of the scan, or between scans for an action). */
  readonly atMs: number;
  /** Scans completed when it happened. */
  readonly scan: number;
  /** The device concerned, by id, if any. */
  readonly device: string | null;
  readonly kind: FieldEventKind;
  readonly message: string;
}

/** A bounded log: keeps the latest `capacity` events and counts the ones it let go. */
export interface EventLog {
  push(event: Omit<FieldEvent, 'seq'>): void;
  /** The events kept, oldest first. */
  list(): readonly FieldEvent[];
  /** Events with `seq >= from`, for a view that polls. */
  since(from: number): readonly FieldEvent[];
  /** How many events were logged in all. */
  readonly total: number;
  /** How many old events were let go to stay within capacity. */
  readonly dropped: number;
}

/** A new empty log. */
export function createEventLog(capacity = 10_000): EventLog {
  let events: FieldEvent[] = [];
  let total = 0;
  let dropped = 0;
  return {
    push(event) {
      events.push({ seq: total, ...event });
      total += 1;
      // Trim in chunks so a busy log does not shift the array on every push.
      if (events.length > capacity + Math.ceil(capacity / 4)) {
        const excess = events.length - capacity;
        events = events.slice(excess);
        dropped += excess;
      }
    },
    list: () => (events.length > capacity ? events.slice(events.length - capacity) : events.slice()),
    // Events are kept in seq order with no gaps, so the first wanted one is found by arithmetic.
    since: (from) => (events.length === 0 ? [] : events.slice(Math.max(0, from - events[0]!.seq))),
    get total() {
      return total;
    },
    get dropped() {
      return dropped + Math.max(0, events.length - capacity);
    },
  };
}
