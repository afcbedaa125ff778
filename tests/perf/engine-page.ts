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
import { mkdirSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import express from 'express';
import { build } from 'vite';
import { securityHeaders } from '../../server/http/security';
import { missingChromiumHint } from '../e2e/support/chromium';
import { launchBenchBrowser } from './benchBrowser';
import { editCount, type CaseSpec } from './engine-cases';
import { measure } from './engine-measure';
import type { EngineFigures } from './engine-targets';
import type { BenchCase } from './run';
import { median } from './stats';

const ROOT = path.resolve('.tmp/bench-page');

/** Write the page's entry (importing each generated case's baseline module) and build it. */
async function buildPage(specs: readonly CaseSpec[]): Promise<string> {
  mkdirSync(ROOT, { recursive: true });
  const generated = specs.filter((s) => s.shape !== undefined);
  const imports = generated.map((s, i) => `import * as b${i} from ${JSON.stringify(path.resolve(`.tmp/bench/engine-baseline-${s.shape}-${s.rungs}.ts`))};`);
  const table = generated.map((s, i) => `  ${JSON.stringify(s.id)}: b${i},`);
  writeFileSync(
    path.join(ROOT, 'main.ts'),
    [
      // As the app's main.ts does: zod would otherwise probe `new Function`, which the policy refuses.
      `import ${JSON.stringify(path.resolve('src/api/zodJitless.ts'))};`,
      `import { installEngineBench } from ${JSON.stringify(path.resolve('tests/perf/engine-page-main.ts'))};`,
      ...imports,
      'installEngineBench({',
      ...table,
      '});',
      '',
    ].join('\n'),
  );
  writeFileSync(path.join(ROOT, 'index.html'), '<!doctype html><html><head><title>engine bench</title><script type="module" src="./main.ts"></script></head><body></body></html>\n');
  const outDir = path.join(ROOT, 'dist');
  await build({
    root: ROOT,
    configFile: false,
    mode: 'production',
    logLevel: 'warn',
    resolve: { alias: { '@shared': path.resolve('shared'), '@': path.resolve('src') } },
    build: { outDir, emptyOutDir: true, chunkSizeWarningLimit: 100_000 },
  });
  return outDir;
}

export async function enginePageCases(specs: readonly CaseSpec[]): Promise<{ figures: EngineFigures[]; summary: BenchCase }> {
  const hint = missingChromiumHint();
  if (hint) return { figures: [], summary: { case: 'engine chromium', skipped: hint } };
  const dist = await buildPage(specs);
  const app = express();
  app.use(securityHeaders());
  app.use(express.static(dist));
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
  // ENGINE_BENCH_BROWSER_ARGS: extra Chromium flags for a diagnosis, e.g. --js-flags=--no-liftoff.
  const { browser, name } = await launchBenchBrowser((process.env.ENGINE_BENCH_BROWSER_ARGS ?? '').split(' ').filter((a) => a !== ''));
  const figures: EngineFigures[] = [];
  const violations: string[] = [];
  try {
    const page = await browser.newPage();
    await page.exposeFunction('reportViolation', (text: string) => violations.push(text));
    await page.addInitScript(`document.addEventListener('securitypolicyviolation', (e) => window.reportViolation(e.violatedDirective + ' ' + e.blockedURI));`);
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    const response = await page.goto(url);
    const csp = response?.headers()['content-security-policy'] ?? '';
    await page.waitForFunction(`document.title === 'engine bench ready'`, undefined, { timeout: 60_000 }).catch(() => {
      throw new Error(`the engine bench page did not start: ${errors.join('; ') || 'no error reported'}`);
    });
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
    return { figures, summary: { case: 'engine chromium page', browser: name, csp, cspViolations: violations.length, cases: figures.length } };
  } finally {
    await browser.close();
    server.close();
  }
}
