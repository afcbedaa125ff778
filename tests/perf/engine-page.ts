/**
 * The engine benchmark in Chromium (Debian's headless shell, see benchBrowser.ts) under the
 * production Content Security Policy: a page built for production by Vite from
 * engine-page-main.ts and the generated baselines, served by Express with the server's own
 * `securityHeaders()`, so the engine compiles its WebAssembly under `script-src 'self'
 * 'wasm-unsafe-eval'` as in the workbench. The page counts `securitypolicyviolation` events; a
 * case that causes one fails the run.
 *
 * Times are CPU time of the page's main thread (DevTools `Performance.getMetrics` ThreadTime), read
 * by Node between steps the page runs one call each: on a machine shared with other work, wall
 * time in the page counted every moment the renderer waited for a core.
 */
import path from 'node:path';
import { missingChromiumHint } from '../e2e/support/chromium';
import { editCount, type CaseSpec } from './engine-cases';
import { measure } from './engine-measure';
import type { EngineFigures } from './engine-targets';
import { openPolicyPage } from './policyPage';
import type { BenchCase } from './run';
import { median } from './stats';

const ROOT = path.resolve('.tmp/bench-page');

/** The page's entry: the engine bench, with each generated case's baseline module. */
function pageEntry(specs: readonly CaseSpec[]): string[] {
  const generated = specs.filter((s) => s.shape !== undefined);
  return [
    // As the app's main.ts does: zod would otherwise probe `new Function`, which the policy refuses.
    `import ${JSON.stringify(path.resolve('src/api/zodJitless.ts'))};`,
    `import { installEngineBench } from ${JSON.stringify(path.resolve('tests/perf/engine-page-main.ts'))};`,
    ...generated.map((s, i) => `import * as b${i} from ${JSON.stringify(path.resolve(`.tmp/bench/engine-baseline-${s.shape}-${s.rungs}.ts`))};`),
    'installEngineBench({',
    ...generated.map((s, i) => `  ${JSON.stringify(s.id)}: b${i},`),
    '});',
  ];
}

export async function enginePageCases(specs: readonly CaseSpec[]): Promise<{ figures: EngineFigures[]; summary: BenchCase }> {
  const hint = missingChromiumHint();
  if (hint) return { figures: [], summary: { case: 'engine chromium', skipped: hint } };
  // ENGINE_BENCH_BROWSER_ARGS: extra Chromium flags for a diagnosis, e.g. --js-flags=--no-liftoff.
  const browserArgs = (process.env.ENGINE_BENCH_BROWSER_ARGS ?? '').split(' ').filter((a) => a !== '');
  const opened = await openPolicyPage({ root: ROOT, title: 'engine bench', entry: pageEntry(specs) }, browserArgs);
  const { page, violations } = opened;
  const figures: EngineFigures[] = [];
  try {
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Performance.enable');
    /** The page's main-thread CPU time, µs. */
    const threadUs = async (): Promise<number> => {
      const { metrics } = (await cdp.send('Performance.getMetrics')) as { metrics: { name: string; value: number }[] };
      return (metrics.find((m) => m.name === 'ThreadTime')?.value ?? Number.NaN) * 1e6;
    };
    const call = (code: string): Promise<unknown> => page.evaluate(code);
    /** CPU ms of the page's main thread for one call. */
    const timed = async (code: string): Promise<[number, unknown]> => {
      const start = await threadUs();
      const value = await call(code);
      return [((await threadUs()) - start) / 1000, value];
    };
    for (const spec of specs) {
      const id = JSON.stringify(spec.id);
      await call(`engineBench.load(${id})`);
      const [compileMs, elements] = await timed('engineBench.compile()');
      const [runtimeMs] = await timed('engineBench.createRuntime()');
      const [firstScanMs] = await timed('engineBench.firstScan()');
      const edits: number[] = [];
      for (let n = 0; n < editCount(spec.rungs); n += 1) {
        await call(`engineBench.edit(${id}, ${n})`);
        edits.push((await timed('engineBench.compileEdit()'))[0]);
      }
      await call(`engineBench.prepare(${id})`);
      const side = (name: 'engine' | 'baseline') => ({ run: (from: number, n: number) => call(`engineBench.run('${name}', ${from}, ${n})`).then(() => undefined) });
      const timing = await measure(side('engine'), side('baseline'), {
        clock: threadUs,
        sampleUs: 20_000,
        samples: 41,
        minWarmupUs: Math.max(2_000_000, 3000 * spec.rungs),
        maxWarmupUs: 90_000_000,
      });
      const f: EngineFigures = {
        host: 'chromium',
        id: spec.id,
        rungs: spec.rungs,
        elements: elements as number,
        engineUs: timing.engineUs,
        baselineUs: timing.baselineUs,
        warmupMs: timing.warmupMs,
        compileMs,
        runtimeMs,
        firstScanMs,
        editMs: median(edits),
      };
      figures.push(f);
      console.error(JSON.stringify({ case: `engine chromium ${f.id}`, engineUs: f.engineUs, baselineUs: f.baselineUs, ratio: Math.round((f.baselineUs / f.engineUs) * 1000) / 1000 }));
    }
    if (violations.length > 0) throw new Error(`Content Security Policy violations in the engine bench page: ${violations.join('; ')}`);
    return { figures, summary: { case: 'engine chromium page', browser: opened.browserName, csp: opened.csp, cspViolations: violations.length, cases: figures.length } };
  } finally {
    await opened.close();
  }
}
