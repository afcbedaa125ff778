/**
 * Proof benchmark (`npm run bench -- proof`): for each standard lab, its safety properties
 * (tests/unit/proof/labProperties.ts) decided for the reference solution and for every typical
 * wrong answer of tests/unit/labs/mistakes.ts — the whole `prove` call, searches, counterexamples
 * and their replays through the check runner. Figures: ms per program (median and best wall
 * time, and CPU time of the process, which a shared machine's load disturbs less), states
 * explored and scans simulated per second of CPU (a state is left by one scan per set of operator
 * moves: up to 128 on the io-checkout lab, where seven devices are read). Target: under 1 s per
 * program.
 */
import { REVERSING_CONVEYOR } from '@shared/field';
import { standardLab, STANDARD_LABS } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';
import { prove, type Property } from '@shared/proof';
import { MISTAKES } from '../unit/labs/mistakes';
import { LAB_CASES } from '../unit/proof/labProperties';
import type { BenchCase } from './run';
import { median, round } from './stats';

const cpuMs = (): number => {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1000;
};

/** One proof of `properties` on `program`: wall ms, CPU ms and the states visited (all searches). */
function once(program: Program, properties: Property[]): { wall: number; cpu: number; states: number; transitions: number; verdicts: string[] } {
  const cpu0 = cpuMs();
  const start = performance.now();
  const result = prove({ program, panel: REVERSING_CONVEYOR, properties });
  const wall = performance.now() - start;
  const cpu = cpuMs() - cpu0;
  if (!result.ok) throw new Error(result.errors.join('; '));
  if (result.results.some((r) => r.defect || r.verdict === 'unknown')) throw new Error('a verdict was unknown');
  // Properties that share a search report the same count: count each search once.
  const searches = [...new Map(result.results.map((r) => [`${r.states}/${r.transitions}`, r])).values()];
  const states = searches.reduce((sum, r) => sum + r.states, 0);
  const transitions = searches.reduce((sum, r) => sum + r.transitions, 0);
  return { wall, cpu, states, transitions, verdicts: result.results.map((r) => r.verdict) };
}

export default async function proofBench(): Promise<BenchCase[]> {
  const cases: BenchCase[] = [];
  for (const lab of STANDARD_LABS) {
    const properties = LAB_CASES.filter((c) => c.lab === lab.id).flatMap((c) => c.properties);
    const unique = [...new Map(properties.map((p) => [JSON.stringify(p), p])).values()];
    const programs: [string, Program][] = [['reference', standardLab(lab.id)!.solution], ...MISTAKES.filter((m) => m.lab === lab.id).map((m): [string, Program] => [m.name, m.program])];
    for (const [name, program] of programs) {
      once(program, unique);
      const runs = Array.from({ length: 5 }, () => once(program, unique));
      const wall = runs.map((r) => r.wall);
      const cpu = runs.map((r) => r.cpu);
      cases.push({
        case: `proof ${lab.id}: ${name}`,
        properties: unique.length,
        verdicts: runs[0]!.verdicts.join(','),
        states: runs[0]!.states,
        msMedian: round(median(wall), 1),
        msBest: round(Math.min(...wall), 1),
        cpuMsMedian: round(median(cpu), 1),
        scans: runs[0]!.transitions,
        statesPerCpuSecond: Math.round(runs[0]!.states / (median(cpu) / 1000)),
        scansPerCpuSecond: Math.round(runs[0]!.transitions / (median(cpu) / 1000)),
        targetMs: 1000,
        meetsTarget: median(cpu) < 1000,
      });
    }
  }
  return cases;
}
