/**
 * Proof benchmark (`npm run bench -- proof`): for each standard lab, its safety properties
 * (tests/unit/proof/labProperties.ts) decided for the reference solution and for every typical
 * wrong answer of tests/unit/labs/mistakes.ts (proof-cases.ts) — the whole `prove` call, searches,
 * counterexamples and their replays through the check runner. Target: under 1 s per program, in
 * Node and in the browser.
 *
 * Node: ms per program (median and best wall time, and CPU time of the process, which a shared
 * machine's load disturbs less), states explored and scans simulated per second of CPU (a state is
 * left by one scan per set of operator moves: up to 128 on the io-checkout lab, where seven devices
 * are read).
 *
 * Chromium (proof-page.ts): the same programs decided in a module Web Worker of a page served under
 * the production Content Security Policy, as the workbench's Proof tab runs them; the run fails if
 * any verdict differs from Node's. `PROOF_BENCH=node|page` runs one side only (the page still
 * compares with Node's verdicts); `PROOF_BENCH_RUNS` sets the timed runs per program (5).
 */
import { REVERSING_CONVEYOR } from '@shared/field';
import type { Program } from '@shared/ladder/schema';
import { prove, type Property } from '@shared/proof';
import { caseKey, proofCases } from './proof-cases';
import { PROOF_TARGET_MS, proofPageRuns } from './proof-page';
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
  const which = process.env.PROOF_BENCH ?? 'both';
  if (!['node', 'page', 'both'].includes(which)) throw new Error(`PROOF_BENCH must be node, page or both, not ${which}`);
  const runs = Number(process.env.PROOF_BENCH_RUNS ?? 5);
  if (!Number.isInteger(runs) || runs < 1) throw new Error(`PROOF_BENCH_RUNS must be a whole number from 1, not ${process.env.PROOF_BENCH_RUNS}`);
  const programs = proofCases();
  const rows: BenchCase[] = [];
  /** Node's verdicts per program, which the page must reproduce exactly. */
  const nodeVerdicts = new Map<string, string>();

  for (const c of programs) {
    if (which === 'page') {
      nodeVerdicts.set(caseKey(c), once(c.program, c.properties).verdicts.join(','));
      continue;
    }
    once(c.program, c.properties);
    const timed = Array.from({ length: runs }, () => once(c.program, c.properties));
    const wall = timed.map((r) => r.wall);
    const cpu = timed.map((r) => r.cpu);
    nodeVerdicts.set(caseKey(c), timed[0]!.verdicts.join(','));
    rows.push({
      case: `proof ${c.lab}: ${c.name}`,
      properties: c.properties.length,
      verdicts: timed[0]!.verdicts.join(','),
      states: timed[0]!.states,
      msMedian: round(median(wall), 1),
      msBest: round(Math.min(...wall), 1),
      cpuMsMedian: round(median(cpu), 1),
      scans: timed[0]!.transitions,
      statesPerCpuSecond: Math.round(timed[0]!.states / (median(cpu) / 1000)),
      scansPerCpuSecond: Math.round(timed[0]!.transitions / (median(cpu) / 1000)),
      targetMs: PROOF_TARGET_MS,
      meetsTarget: median(cpu) < PROOF_TARGET_MS,
    });
  }
  if (which === 'node') return rows;

  const { proofs, summary } = await proofPageRuns(programs.map(caseKey), runs);
  const differences: string[] = [];
  for (const p of proofs) {
    const expected = nodeVerdicts.get(p.key);
    if (p.verdicts.join(',') !== expected) differences.push(`${p.key}: ${p.verdicts.join(',')} in Chromium, ${expected} in Node`);
    rows.push({
      case: `proof chromium: ${p.key}`,
      verdicts: p.verdicts.join(','),
      states: p.states,
      ms: round(p.ms, 1),
      msFirst: round(p.msFirst, 1),
      wallMs: round(p.wallMs, 1),
      statesPerS: Math.round(p.states / (p.ms / 1000)),
      mainThreadMaxGapMs: round(p.mainThreadMaxGapMs, 1),
      meetsTarget: p.ms < PROOF_TARGET_MS,
    });
  }
  if (differences.length > 0) throw new Error(`the browser's verdicts differ from Node's:\n  ${differences.join('\n  ')}`);
  rows.push(summary);
  return rows;
}
