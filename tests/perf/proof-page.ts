/**
 * The proof benchmark in Chromium (Debian's headless shell, see benchBrowser.ts) under the
 * production Content Security Policy: a page built for production by Vite from proof-page-main.ts,
 * whose module worker (proof-page-worker.ts, `new Worker(new URL(…), { type: 'module' })`, as the
 * workbench's Proof tab starts it) runs `prove`. Served by Express with the server's own
 * `securityHeaders()`, which cover the worker's script too, and with the app's classic
 * `zod-jitless.js` ahead of the modules, as index.html has it. A `securitypolicyviolation` in the
 * page or the worker fails the run.
 *
 * Figures per program: `ms` is `prove` timed inside the worker (median of the timed runs, after
 * one first run in the fresh page, reported apart as `msFirst`), `wallMs` from posting the request
 * to the answer on the main thread, and the main thread's longest gap between two ticks of a 5 ms
 * timer meanwhile. Wall times: the worker's CPU time is not readable from DevTools here, so on a
 * shared machine every moment the worker waited for a core is counted.
 */
import path from 'node:path';
import { missingChromiumHint } from '../e2e/support/chromium';
import { openPolicyPage } from './policyPage';
import type { ProofRun } from './proof-page-main';
import type { BenchCase } from './run';
import { median, round } from './stats';

const ROOT = path.resolve('.tmp/bench-proof-page');
export const PROOF_TARGET_MS = 1000;

export interface PageProof {
  key: string;
  verdicts: string[];
  states: number;
  transitions: number;
  msFirst: number;
  ms: number;
  wallMs: number;
  mainThreadMaxGapMs: number;
}

/**
 * Every key's proof in the page: one first run each, then `runs` timed runs each. Resolves with
 * the per-program figures and a summary row; `skipped` when Chromium is missing.
 */
export async function proofPageRuns(keys: readonly string[], runs: number): Promise<{ proofs: PageProof[]; summary: BenchCase }> {
  const hint = missingChromiumHint();
  if (hint) return { proofs: [], summary: { case: 'proof chromium', skipped: hint } };
  const opened = await openPolicyPage({
    root: ROOT,
    title: 'proof bench',
    entry: [
      `import { installProofBench } from ${JSON.stringify(path.resolve('tests/perf/proof-page-main.ts'))};`,
      'installProofBench((text) => (window as unknown as { reportViolation(t: string): void }).reportViolation(text));',
    ],
    appScripts: true,
    moduleWorker: true,
  });
  const { page, violations, errors } = opened;
  try {
    const workerStartMs = (await page.evaluate('proofBench.ready()')) as number;
    const inPage = (await page.evaluate('proofBench.keys()')) as string[];
    const missing = keys.filter((k) => !inPage.includes(k));
    if (missing.length > 0) throw new Error(`the page lacks cases ${missing.join(', ')}`);
    const run = (key: string) => page.evaluate(`proofBench.run(${JSON.stringify(key)})`) as Promise<ProofRun>;
    // Each program's first proof in the fresh worker first (the one a student's first click pays), then the timed runs.
    const first = new Map<string, ProofRun>();
    for (const key of keys) first.set(key, await run(key));
    const proofs: PageProof[] = [];
    for (const key of keys) {
      const timed: ProofRun[] = [];
      for (let i = 0; i < runs; i++) timed.push(await run(key));
      const f = first.get(key)!;
      for (const r of timed) {
        if (r.verdicts.join(',') !== f.verdicts.join(',')) throw new Error(`${key}: the page's verdicts changed between runs (${f.verdicts} then ${r.verdicts})`);
      }
      proofs.push({
        key,
        verdicts: f.verdicts,
        states: f.states,
        transitions: f.transitions,
        msFirst: f.workerMs,
        ms: median(timed.map((r) => r.workerMs)),
        wallMs: median(timed.map((r) => r.wallMs)),
        mainThreadMaxGapMs: Math.max(f.mainThreadMaxGapMs, ...timed.map((r) => r.mainThreadMaxGapMs)),
      });
    }
    if (violations.length > 0) throw new Error(`Content Security Policy violations in the proof bench page: ${violations.join('; ')}`);
    if (errors.length > 0) throw new Error(`errors in the proof bench page: ${errors.join('; ')}`);
    const maxMs = Math.max(...proofs.map((p) => p.ms));
    const maxFirst = Math.max(...proofs.map((p) => p.msFirst));
    return {
      proofs,
      summary: {
        case: 'proof chromium summary',
        browser: opened.browserName,
        csp: opened.csp,
        cspViolations: violations.length,
        programs: proofs.length,
        workerStartMs: round(workerStartMs, 1),
        maxMs: round(maxMs, 1),
        maxMsFirst: round(maxFirst, 1),
        maxWallMs: round(Math.max(...proofs.map((p) => p.wallMs)), 1),
        mainThreadMaxGapMs: round(Math.max(...proofs.map((p) => p.mainThreadMaxGapMs)), 1),
        targetMs: PROOF_TARGET_MS,
        everyUnderTarget: maxMs < PROOF_TARGET_MS,
        everyFirstUnderTarget: maxFirst < PROOF_TARGET_MS,
      },
    };
  } finally {
    await opened.close();
  }
}
