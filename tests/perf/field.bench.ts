/**
 * Field panel benchmarks (`npx tsx tests/perf/run.ts field`):
 *  - grading each standard lab's reference solution with its check script, in ms per grading run
 *    (compile, simulate, check, report); target under 5 ms;
 *  - one hour of virtual time on the default panel at a 10 ms scan with the belt running forward
 *    (engine + field each scan), in scans per second; target above 1 million.
 * Medians over repeated runs after a warm-up (with the best run beside them, since a shared
 * machine's load moves the median); wall-clock timing lives here, never in tests.
 */
import { runChecks } from '@shared/checks';
import { createSimulation, REVERSING_CONVEYOR } from '@shared/field';
import { FORWARD_REVERSE, STANDARD_LABS } from '@shared/labs';
import type { BenchCase } from './run';
import { median, percentile, round } from './stats';

/** CPU time of this process in ms (user + system): on a shared, loaded machine it tells the work apart from the waiting. */
function cpuMs(): number {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1000;
}

function timeGrading(labIndex: number, repetitions: number): { wall: number[]; cpuMsPerRun: number } {
  const lab = STANDARD_LABS[labIndex]!;
  const wall: number[] = [];
  const cpuStart = cpuMs();
  for (let i = 0; i < repetitions; i += 1) {
    const start = performance.now();
    const result = runChecks({ program: lab.solution, panel: REVERSING_CONVEYOR, script: lab.script });
    const ms = performance.now() - start;
    if (!result.ok || !result.report.passed) throw new Error(`${lab.id}: the reference solution did not pass`);
    wall.push(ms);
  }
  return { wall, cpuMsPerRun: (cpuMs() - cpuStart) / repetitions };
}

function hourOfVirtualTime(): { scans: number; ms: number; cpu: number } {
  const created = createSimulation({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, scanMs: 10 });
  if (!created.ok) throw new Error(created.error);
  const sim = created.simulation;
  sim.press('S2');
  sim.run(100);
  sim.release('S2');
  sim.run(1000);
  if (sim.word('M1') !== 'forward') throw new Error('the belt is not running');
  const scans = (3_600_000 / 10) | 0;
  const cpuStart = cpuMs();
  const start = performance.now();
  for (let n = 0; n < scans; n += 1) sim.scan();
  const ms = performance.now() - start;
  const cpu = cpuMs() - cpuStart;
  if (sim.word('K1') !== 'closed') throw new Error('the belt stopped during the hour');
  return { scans, ms, cpu };
}

export default async function fieldBench(): Promise<BenchCase[]> {
  const cases: BenchCase[] = [];
  for (let i = 0; i < STANDARD_LABS.length; i += 1) {
    const lab = STANDARD_LABS[i]!;
    timeGrading(i, 20);
    const { wall: samples, cpuMsPerRun } = timeGrading(i, 100);
    const report = runChecks({ program: lab.solution, panel: REVERSING_CONVEYOR, script: lab.script });
    const scans = report.ok ? report.report.scans : 0;
    cases.push({
      case: `field: grade lab ${lab.id} (reference solution)`,
      msPerGrading: round(median(samples)),
      minMs: round(Math.min(...samples)),
      p90Ms: round(percentile(samples, 90)),
      cpuMsPerGrading: round(cpuMsPerRun),
      scansPerGrading: scans,
      targetMs: 5,
      meetsTarget: median(samples) < 5,
    });
  }
  hourOfVirtualTime();
  const runs = [hourOfVirtualTime(), hourOfVirtualTime(), hourOfVirtualTime()];
  const rates = runs.map((r) => (r.scans / r.ms) * 1000);
  cases.push({
    case: 'field: one hour of virtual time, default panel, 10 ms scan, belt running',
    scans: runs[0]!.scans,
    scansPerSec: Math.round(median(rates)),
    bestScansPerSec: Math.round(Math.max(...rates)),
    cpuScansPerSec: Math.round(median(runs.map((r) => (r.scans / r.cpu) * 1000))),
    usPerScan: round(1_000_000 / median(rates), 3),
    wallMs: round(median(runs.map((r) => r.ms))),
    target: 1_000_000,
    meetsTarget: median(rates) > 1_000_000,
  });
  return cases;
}
