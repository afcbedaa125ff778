/**
 * The trace behind the timing diagram: a ring buffer over virtual time that keeps the last 60 s
 * (by default) of every recorded signal, one row per scan. Values are numbers: bits as 0/1, ET in
 * ms, CV as counts; NaN where a signal was not yet recorded (picked later) or names nothing.
 */

/** How far back the trace reaches, in virtual ms. */
export const TRACE_WINDOW_MS = 60_000;

export interface TraceWindow {
  /** Virtual time of each row, ms, oldest first. */
  times: number[];
  /** One array per signal, aligned with `times`. */
  columns: number[][];
}

export interface TraceBuffer {
  /** The signals recorded, in column order. */
  readonly signals: readonly string[];
  /** Rows currently kept. */
  readonly length: number;
  /** Virtual time of the newest row, ms; NaN when empty. */
  readonly latestMs: number;
  /** Record from now on exactly these signals; columns of signals kept survive, new ones start empty. */
  setSignals(signals: readonly string[]): void;
  /** Append one row, reading each signal with `read`. */
  record(timeMs: number, read: (signal: string) => boolean | number | undefined): void;
  /** The rows with `fromMs <= time <= toMs` (all rows when omitted) for the chosen signals. */
  window(signals: readonly string[], fromMs?: number, toMs?: number): TraceWindow;
  /** `time_ms,<signal>...` then one line a row; bits 0/1, empty cells where nothing was recorded. */
  toCSV(signals: readonly string[]): string;
  clear(): void;
}

const toNumber = (value: boolean | number | undefined): number =>
  value === undefined ? Number.NaN : typeof value === 'boolean' ? (value ? 1 : 0) : value;

/** RFC 4180 quoting for a header cell. */
const csvField = (text: string): string => (/[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text);

/**
 * A trace buffer keeping at most `capacity` rows and only rows newer than `windowMs` before the
 * latest one. Capacity should cover the window at the shortest scan period (60 001 rows at 1 ms).
 */
export function createTraceBuffer(options: { capacity?: number; windowMs?: number } = {}): TraceBuffer {
  const capacity = options.capacity ?? TRACE_WINDOW_MS + 1;
  const windowMs = options.windowMs ?? TRACE_WINDOW_MS;
  let signals: string[] = [];
  let columns: Float64Array[] = [];
  const times = new Float64Array(capacity);
  let start = 0;
  let length = 0;

  const at = (i: number): number => (start + i) % capacity;

  /** Drop rows that fell out of the time window. */
  const trim = (): void => {
    if (length === 0) return;
    const newest = times[at(length - 1)]!;
    while (length > 0 && times[start]! < newest - windowMs) {
      start = (start + 1) % capacity;
      length -= 1;
    }
  };

  const firstIndexFrom = (fromMs: number): number => {
    let lo = 0;
    let hi = length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (times[at(mid)]! < fromMs) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };

  return {
    get signals() {
      return signals;
    },
    get length() {
      return length;
    },
    get latestMs() {
      return length === 0 ? Number.NaN : times[at(length - 1)]!;
    },
    setSignals(next) {
      const old = new Map(signals.map((s, i) => [s, columns[i]!] as const));
      signals = [...new Set(next)];
      columns = signals.map((s) => old.get(s) ?? new Float64Array(capacity).fill(Number.NaN));
    },
    record(timeMs, read) {
      let slot: number;
      if (length < capacity) {
        slot = at(length);
        length += 1;
      } else {
        slot = start;
        start = (start + 1) % capacity;
      }
      times[slot] = timeMs;
      for (let c = 0; c < signals.length; c += 1) columns[c]![slot] = toNumber(read(signals[c]!));
      trim();
    },
    window(wanted, fromMs = Number.NEGATIVE_INFINITY, toMs = Number.POSITIVE_INFINITY) {
      const first = firstIndexFrom(fromMs);
      const picked = wanted.map((s) => {
        const c = signals.indexOf(s);
        return c < 0 ? null : columns[c]!;
      });
      const out: TraceWindow = { times: [], columns: wanted.map(() => []) };
      for (let i = first; i < length; i += 1) {
        const slot = at(i);
        const t = times[slot]!;
        if (t > toMs) break;
        out.times.push(t);
        picked.forEach((column, k) => out.columns[k]!.push(column === null ? Number.NaN : column[slot]!));
      }
      return out;
    },
    toCSV(wanted) {
      const { times: ts, columns: cs } = this.window(wanted);
      const header = ['time_ms', ...wanted].map(csvField).join(',');
      const lines = ts.map((t, i) => [String(t), ...cs.map((c) => (Number.isNaN(c[i]!) ? '' : String(c[i])))].join(','));
      return [header, ...lines].join('\n') + '\n';
    },
    clear() {
      start = 0;
      length = 0;
    },
  };
}
