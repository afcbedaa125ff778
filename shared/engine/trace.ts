/**
 * The trace recorder behind the timing diagram and `--trace out.csv`: after each scan,
 * `record()` stores the value of every signal asked for.
 */
import { addressKeyOf } from './operandAccess';
import type { Runtime } from './runtime';

/** One recorded scan. */
export interface TraceRow {
  /** Virtual time after the scan, ms. */
  readonly timeMs: number;
  /** Scans run so far (1 after the first). */
  readonly scan: number;
  /** Per signal: BOOL as boolean, ET in ms and CV as numbers, `undefined` for a signal that names nothing. */
  readonly values: ReadonlyArray<boolean | number | undefined>;
  /** Per signal: the bit was forced when recorded. */
  readonly forced: readonly boolean[];
}

export interface Trace {
  /** The signals, as asked for. */
  readonly signals: readonly string[];
  /** Signals that name nothing in the runtime's plan (recorded as empty cells). */
  readonly unresolved: readonly string[];
  /** Record the runtime's current values; call after each scan. */
  record(): void;
  rows(): readonly TraceRow[];
  /** `time_ms,scan,<signal>...`, then one line per row: 0/1 for bits, numbers for ET/CV. */
  toCSV(): string;
  clear(): void;
}

/** Quote a CSV field when it needs it (RFC 4180). */
function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

function csvValue(value: boolean | number | undefined): string {
  if (value === undefined) return '';
  if (typeof value === 'boolean') return value ? '1' : '0';
  return String(value);
}

/** Start recording `signals` (addresses, tags or members) of a runtime. */
export function createTrace(runtime: Runtime, signals: string[]): Trace {
  const names = [...signals];
  const unresolved = names.filter((signal) => runtime.read(signal) === undefined);
  const addressKeys = names.map((signal) => addressKeyOf(runtime.plan, signal));
  const recorded: TraceRow[] = [];
  return {
    signals: names,
    unresolved,
    record() {
      const forces = runtime.forces();
      recorded.push({
        timeMs: runtime.timeMs,
        scan: runtime.scanCount,
        values: names.map((signal) => runtime.read(signal)),
        forced: addressKeys.map((key) => key !== null && forces.has(key)),
      });
    },
    rows: () => recorded,
    toCSV() {
      const header = ['time_ms', 'scan', ...names].map(csvField).join(',');
      const lines = recorded.map((row) => [String(row.timeMs), String(row.scan), ...row.values.map(csvValue)].join(','));
      return [header, ...lines].join('\n') + '\n';
    },
    clear() {
      recorded.length = 0;
    },
  };
}
