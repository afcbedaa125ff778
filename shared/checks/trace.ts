/**
 * The trace a check run keeps: every panel input and output bit, one row each time any of them
 * changes (plus the first scan), as `[time_ms, scan, bit…]`. The CSV has the engine trace's header
 * shape: `time_ms,scan,<signal>…` with 0/1 for bits.
 */

export interface TraceData {
  signals: string[];
  /** `[timeMs, scan, ...values]`, one row per change. */
  rows: number[][];
  /** True when rows stopped being kept at the row limit. */
  truncated: boolean;
}

/** More rows than this and the trace stops growing (a program toggling every scan). */
export const MAX_TRACE_ROWS = 20_000;

/** A recorder that keeps a row only when a value changed. */
export interface ChangeTrace {
  record(timeMs: number, scan: number): void;
  data(): TraceData;
}

/** `read(i)` gives signal i's current value as a number. */
export function createChangeTrace(signals: string[], read: (i: number) => number, maxRows = MAX_TRACE_ROWS): ChangeTrace {
  const rows: number[][] = [];
  let last: number[] | null = null;
  let truncated = false;
  const current = new Array<number>(signals.length);
  return {
    record(timeMs, scan) {
      let changed = last === null;
      for (let i = 0; i < signals.length; i += 1) {
        const v = read(i);
        current[i] = v;
        if (last !== null && last[i] !== v) changed = true;
      }
      if (!changed) return;
      if (rows.length >= maxRows) {
        truncated = true;
        return;
      }
      last = current.slice();
      rows.push([timeMs, scan, ...last]);
    },
    data: () => ({ signals: signals.slice(), rows: rows.map((r) => r.slice()), truncated }),
  };
}

/** The trace as CSV, one line per row, `\n` line ends. */
export function traceToCSV(trace: TraceData): string {
  const lines = [['time_ms', 'scan', ...trace.signals].join(',')];
  for (const row of trace.rows) lines.push(row.join(','));
  return `${lines.join('\n')}\n`;
}
