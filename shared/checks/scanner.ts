/**
 * Runs a check script's scans, leaping over the quiet ones: after a scan that changed nothing but
 * running timers and closed-form field states (see `Simulation.quietScans`), the scans up to the
 * next thing that can happen — a timer's end, a thermal trip, the end of the step (the next script
 * action) — are counted, not run. Exact by construction: the report is the same with and without
 * leaping, scan for scan (tests/unit/checks/leap.test.ts compares both on random programs).
 *
 * Probing costs a copy of the machine state, so after a scan that was not quiet the next probe
 * waits a little longer each time (up to `MAX_PROBE_GAP` scans): a busy program runs at full
 * speed, an idle one leaps after a few scans.
 */
import type { QuietProbe, Simulation } from '../field/simulationApi';

const MAX_PROBE_GAP = 64;

export interface ScanCounts {
  /** Scans run one by one. */
  run: number;
  /** Scans leapt over. */
  leapt: number;
}

export interface Scanner {
  /**
   * Run `scans` scans, calling `afterScan` after each one that runs. A leapt scan shows the same
   * bits and words as the scan before it, so a watcher of those sees nothing new in it; `timers`
   * false keeps running timers from being leapt (for a watcher of an elapsed time).
   */
  run(scans: number, afterScan?: () => void, timers?: boolean): void;
  readonly counts: ScanCounts;
}

export function createScanner(sim: Simulation, scanOnce: () => void, leaping: boolean): Scanner {
  let probe: QuietProbe | undefined;
  let gap = 0;
  let wait = 0;
  const counts: ScanCounts = { run: 0, leapt: 0 };
  return {
    counts,
    run(scans, afterScan, timers = true) {
      let left = scans;
      while (left > 0) {
        const probing = leaping && left > 1 && wait === 0;
        if (probing) probe = sim.probe(probe);
        scanOnce();
        counts.run += 1;
        left -= 1;
        afterScan?.();
        if (!probing) {
          if (wait > 0) wait -= 1;
          continue;
        }
        const quiet = sim.quietScans(probe!, timers);
        if (quiet > 0) {
          const n = Math.min(quiet, left);
          sim.leap(n);
          counts.leapt += n;
          left -= n;
          gap = 0;
        } else {
          gap = Math.min(MAX_PROBE_GAP, gap === 0 ? 1 : gap * 2);
          wait = gap;
        }
      }
    },
  };
}
