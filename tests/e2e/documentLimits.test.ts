/**
 * A program stored before the document size limits existed, nested 973 levels deep, crashed the
 * workbench and the instructor's review page ("Maximum call stack size exceeded"). The server no
 * longer stores one, so the test hands the pages such a document by rewriting the API's answer in
 * the browser: both pages must open with a clear message, and the review page must keep the
 * grade and feedback usable.
 */
import { describe, expect, it } from 'vitest';
import type { Page, Route } from 'playwright-core';
import { DEMO_INSTRUCTOR } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();

/** A valid-looking document whose one rung nests `levels` parallel/series levels. */
function deepDocument(levels: number): unknown {
  let node: unknown = { kind: 'contact', id: 'c0', variant: 'no', operand: '%IX1' };
  for (let i = levels; i >= 1; i -= 1) node = i % 2 === 1 ? { kind: 'parallel', id: `p${i}`, branches: [node] } : { kind: 'series', id: `s${i}`, items: [node] };
  return { format: 'rungwright.program', version: 1, title: 'Nested (demo)', description: '', tags: [], rungs: [{ id: 'r1', comment: '', network: { kind: 'series', id: 'root', items: [node] } }] };
}

/** Answers the page's request with the server's JSON, the document swapped for a deep one at `set`. */
function withDeepDocument(set: (body: Record<string, unknown>, doc: unknown) => void) {
  return async (route: Route) => {
    const response = await route.fetch();
    const body = (await response.json()) as Record<string, unknown>;
    set(body, deepDocument(973));
    await route.fulfill({ response, json: body });
  };
}

async function getJson<T>(page: Page, path: string): Promise<T> {
  const res = await page.request.get(`${suite.server.url}${path}`);
  expect(res.status(), path).toBe(200);
  return (await res.json()) as T;
}

describe('a stored program nested far past the limits', () => {
  it('opens the workbench with a message instead of crashing', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_INSTRUCTOR);
    const errors: string[] = [];
    page.on('pageerror', (err) => errors.push(err.message));
    const { programs } = await getJson<{ programs: { id: string }[] }>(page, '/api/programs');
    const id = programs[0]!.id;
    await page.route(`**/api/programs/${id}`, withDeepDocument((body, doc) => ((body.head as Record<string, unknown>).document = doc)));
    await page.goto(`${suite.server.url}/programs/${id}`, { waitUntil: 'networkidle' });
    const alert = page.getByText(/This program's saved document cannot be opened/);
    await alert.waitFor();
    expect(await alert.innerText()).toMatch(/branches nest more than 32 levels deep in rung 1\. An earlier version can be opened or restored from History\./);
    await page.screenshot({ path: `${SHOTS}/document-too-deep-workbench.png` });
    expect(errors).toEqual([]);
    await context.close();
  }, 60_000);

  it('opens the review page with the program replaced by a message, grade and feedback still there', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_INSTRUCTOR);
    const errors: string[] = [];
    page.on('pageerror', (err) => errors.push(err.message));
    const { classes } = await getJson<{ classes: { id: string }[] }>(page, '/api/classes');
    let submissionId: string | null = null;
    for (const cls of classes) {
      const { labs } = await getJson<{ labs: { id: string }[] }>(page, `/api/classes/${cls.id}/labs`);
      for (const lab of labs) {
        const { submissions } = await getJson<{ submissions: { id: string }[] }>(page, `/api/labs/${lab.id}/submissions`);
        submissionId ??= submissions[0]?.id ?? null;
      }
    }
    expect(submissionId, 'the demo data holds submissions').not.toBeNull();
    await page.route(`**/api/submissions/${submissionId}`, withDeepDocument((body, doc) => (((body.submission as Record<string, unknown>).program as Record<string, unknown>).document = doc)));
    await page.goto(`${suite.server.url}/submissions/${submissionId}`, { waitUntil: 'networkidle' });
    const alert = page.getByTestId('program-error');
    await alert.waitFor();
    expect(await alert.innerText()).toMatch(/^The submitted program cannot be shown: rungs\[0\]\.network\.items\[0\]\.branches\[0\]….*branches nest more than 32 levels deep in rung 1\. The grade, the report and the feedback still work\.$/s);
    await page.getByRole('button', { name: 'Return to student' }).waitFor();
    await page.getByRole('button', { name: 'Replay the check run' }).waitFor();
    expect(await page.getByRole('button', { name: 'Replay the check run' }).isDisabled()).toBe(true);
    await page.screenshot({ path: `${SHOTS}/document-too-deep-review.png`, fullPage: true });
    expect(errors).toEqual([]);
    await context.close();
  }, 60_000);
});
