/**
 * Accessibility checks for the browser suite: axe-core (the engine itself, injected into the page;
 * its Playwright wrapper needs a newer Node) run over the whole document. A page passes when axe
 * finds no violation of serious or critical impact; moderate and minor ones are reported by
 * `axeFindings` but do not fail `expectAccessible`.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const require = createRequire(import.meta.url);
const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/** The impacts that fail a page. */
export const FAILING_IMPACTS = ['serious', 'critical'] as const;

/** One rule axe found broken on a page: which, how bad, and where (CSS selectors of up to five nodes). */
export interface AxeFinding {
  rule: string;
  impact: string;
  help: string;
  nodes: number;
  targets: string[];
  /** axe's own account of the first node (for contrast: the two colours and the ratio found). */
  why: string;
}

interface AxeRunResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: unknown[]; failureSummary?: string }[] }[];
}

/** Every violation axe finds on the page as it is now. */
export async function axeFindings(page: Page): Promise<AxeFinding[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const result = (await page.evaluate(() =>
    (window as unknown as { axe: { run: (context: Document, options: object) => Promise<unknown> } }).axe.run(document, { resultTypes: ['violations'] }),
  )) as AxeRunResult;
  return result.violations.map((v) => ({
    rule: v.id,
    impact: v.impact ?? 'unknown',
    help: v.help,
    nodes: v.nodes.length,
    targets: v.nodes.slice(0, 5).map((n) => n.target.map(String).join(' ')),
    why: (v.nodes[0]?.failureSummary ?? '').replace(/\s+/g, ' ').trim(),
  }));
}

/** The serious and critical findings only. */
export function failing(findings: readonly AxeFinding[]): AxeFinding[] {
  return findings.filter((f) => (FAILING_IMPACTS as readonly string[]).includes(f.impact));
}

/** One line per finding, for a failure message a person can act on. */
export function describeFindings(name: string, findings: readonly AxeFinding[]): string {
  return findings.map((f) => `${name}: ${f.rule} (${f.impact}, ${f.nodes} node${f.nodes === 1 ? '' : 's'}) ${f.help} — ${f.targets.join(' | ')}${f.why ? ` — ${f.why}` : ''}`).join('\n');
}

/** Fails with every serious or critical violation on the page, named by `name` (page and state). */
export async function expectAccessible(page: Page, name: string): Promise<void> {
  const bad = failing(await axeFindings(page));
  if (bad.length > 0) throw new Error(`axe found serious or critical violations:\n${describeFindings(name, bad)}`);
}
