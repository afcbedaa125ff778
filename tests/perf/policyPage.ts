/**
 * A benchmark page under the production Content Security Policy: an entry module built for
 * production by Vite, served by Express with the server's own `securityHeaders()`, opened in the
 * bench browser (benchBrowser.ts) with every `securitypolicyviolation` and page error collected.
 * The engine and proof page benchmarks both run in one.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import express from 'express';
import type { Page } from 'playwright-core';
import { build } from 'vite';
import { securityHeaders } from '../../server/http/security';
import { launchBenchBrowser } from './benchBrowser';

export interface BenchPageSource {
  /** Where the page is written and built (`<root>/dist`). */
  root: string;
  /** The page's `<title>`; its entry sets `document.title` to `<title> ready` when it is. */
  title: string;
  /** The entry module's lines. */
  entry: readonly string[];
  /**
   * Load the app's classic `zod-jitless.js` ahead of the modules and serve `public/`, as
   * index.html does (a page whose entry imports `src/api/zodJitless.ts` does not need it).
   */
  appScripts?: boolean;
  /** The page starts a module worker, which may import chunks of its own. */
  moduleWorker?: boolean;
}

export interface PolicyPage {
  page: Page;
  /** The browser build, for the figures (`chromium-headless-shell 156…`). */
  browserName: string;
  /** The policy the page was served with. */
  csp: string;
  /** Violations so far, each `<directive> <blocked URI>`. */
  violations: string[];
  /** Uncaught errors in the page so far. */
  errors: string[];
  close(): Promise<void>;
}

async function buildPage(source: BenchPageSource): Promise<string> {
  const { root } = source;
  mkdirSync(root, { recursive: true });
  writeFileSync(path.join(root, 'main.ts'), [...source.entry, ''].join('\n'));
  const classic = source.appScripts ? '<script src="/zod-jitless.js"></script>' : '';
  writeFileSync(
    path.join(root, 'index.html'),
    `<!doctype html><html><head><title>${source.title}</title>${classic}<script type="module" src="./main.ts"></script></head><body></body></html>\n`,
  );
  const outDir = path.join(root, 'dist');
  await build({
    root,
    configFile: false,
    mode: 'production',
    logLevel: 'warn',
    publicDir: source.appScripts ? path.resolve('public') : false,
    resolve: { alias: { '@shared': path.resolve('shared'), '@': path.resolve('src') } },
    ...(source.moduleWorker ? { worker: { format: 'es' as const } } : {}),
    build: { outDir, emptyOutDir: true, chunkSizeWarningLimit: 100_000 },
  });
  return outDir;
}

/** Build the page, serve it, and open it in the bench browser; resolves once the page says it is ready. */
export async function openPolicyPage(source: BenchPageSource, browserArgs: readonly string[] = []): Promise<PolicyPage> {
  const dist = await buildPage(source);
  const app = express();
  app.use(securityHeaders());
  app.use(express.static(dist));
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
  const { browser, name } = await launchBenchBrowser(browserArgs);
  const close = async (): Promise<void> => {
    await browser.close();
    server.close();
  };
  try {
    const violations: string[] = [];
    const errors: string[] = [];
    const page = await browser.newPage();
    await page.exposeFunction('reportViolation', (text: string) => violations.push(text));
    await page.addInitScript(`document.addEventListener('securitypolicyviolation', (e) => window.reportViolation(e.violatedDirective + ' ' + e.blockedURI));`);
    page.on('pageerror', (e) => errors.push(e.message));
    const response = await page.goto(url);
    const csp = response?.headers()['content-security-policy'] ?? '';
    await page.waitForFunction(`document.title === ${JSON.stringify(`${source.title} ready`)}`, undefined, { timeout: 60_000 }).catch(() => {
      throw new Error(`the ${source.title} page did not start: ${errors.join('; ') || 'no error reported'}`);
    });
    return { page, browserName: name, csp, violations, errors, close };
  } catch (error) {
    await close();
    throw error;
  }
}
