/**
 * Every page of the route table, checked with axe-core in a real browser, in the light and the dark
 * scheme: signed out, as a student, as an instructor and as an admin. A page fails on any violation
 * of serious or critical impact. The last test compares the pages visited with the route table,
 * so a new page cannot be left out. Every finding (moderate and minor included) is written to
 * tests/e2e/screenshots/accessibility.json to be read.
 */
import { writeFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { createMemoryHistory, createRouter } from 'vue-router';
import { routes } from '@/router/routes';
import { DEMO_ADMIN, DEMO_INSTRUCTOR, DEMO_STUDENTS, type DemoAccount } from '../../server/db/demoAccounts';
import { axeFindings, describeFindings, failing, type AxeFinding } from './support/accessibility';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
const SCHEMES = ['light', 'dark'] as const;
type Scheme = (typeof SCHEMES)[number];
type Who = 'signed-out' | 'student' | 'instructor' | 'admin';

/** The route table resolved in memory, to name the route each visited path lands on. */
const router = createRouter({ history: createMemoryHistory(), routes });
const visitedRoutes = new Set<string>();
const report: Record<string, AxeFinding[]> = {};

interface Visit {
  path: string;
  /** Waits until the page shows what it is for (data loaded, the workbench's chrome mounted). */
  ready?: (page: Page) => Promise<void>;
}

const workbenchReady = async (page: Page) => {
  await page.getByTestId('rung-canvas').waitFor();
  await page.waitForFunction(() => performance.getEntriesByName('rungwright:workbench-ready').length > 0);
};
/** The workbench with its Proof tab shown and the form that adds a property open. */
const proofTabReady = async (page: Page) => {
  await workbenchReady(page);
  await page.getByRole('tab', { name: 'Proof' }).click();
  await page.getByTestId('add-property-open').click();
  await page.getByTestId('add-property').waitFor();
};
const labReady = async (page: Page) => {
  await page.getByTestId('rung-canvas').waitFor();
  await page.getByTestId('save-status').filter({ hasText: /Saved/ }).waitFor();
};
const tableReady = async (page: Page) => {
  await page.locator('.n-base-loading').first().waitFor({ state: 'detached' }).catch(() => undefined);
};

/** The ids the signed-in pages need, read from the API as the demo seeded it. */
interface DemoIds {
  programId: string;
  classId: string;
  threeWireLabId: string;
  forwardReverseLabId: string;
  submissionId: string;
}

async function apiJson<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (p) => {
    const res = await fetch(p);
    if (!res.ok) throw new Error(`${p} answered ${res.status}`);
    return res.json();
  }, path) as Promise<T>;
}

async function demoIds(page: Page): Promise<DemoIds> {
  const { classes } = await apiJson<{ classes: { id: string }[] }>(page, '/api/classes');
  const classId = classes[0]!.id;
  const { labs } = await apiJson<{ labs: { id: string; title: string }[] }>(page, `/api/classes/${classId}/labs`);
  const threeWireLabId = labs.find((l) => /^Three-wire/.test(l.title))!.id;
  const forwardReverseLabId = labs.find((l) => /^Forward/.test(l.title))!.id;
  const { programs } = await apiJson<{ programs: { id: string; title: string }[] }>(page, '/api/programs');
  const programId = programs[0]?.id ?? '';
  // Only staff may list a lab's submissions; a student's pages do not need one.
  const answer = await apiJson<{ submissions: { id: string }[] }>(page, `/api/labs/${forwardReverseLabId}/submissions`).catch(() => ({ submissions: [] }));
  const submissionId = answer.submissions[0]?.id ?? '';
  return { programId, classId, threeWireLabId, forwardReverseLabId, submissionId };
}

function visitsFor(who: Who, ids: DemoIds | null): Visit[] {
  switch (who) {
    case 'signed-out':
      return [
        { path: '/sign-in' },
        { path: '/join' },
        { path: '/join/finish' },
        { path: '/reset-password' },
        { path: '/accept-invitation' },
        { path: '/simulator', ready: (p) => p.getByTestId('rung-canvas').waitFor() },
        { path: '/no-such-page' },
      ];
    case 'student':
      return [
        { path: '/programs', ready: tableReady },
        { path: `/programs/${ids!.programId}`, ready: workbenchReady },
        { path: `/programs/${ids!.programId}`, ready: proofTabReady },
        { path: '/classes', ready: tableReady },
        { path: `/classes/${ids!.classId}/labs`, ready: tableReady },
        { path: `/labs/${ids!.threeWireLabId}`, ready: labReady },
        { path: '/account' },
      ];
    case 'instructor':
      return [
        { path: '/classes', ready: tableReady },
        { path: `/classes/${ids!.classId}/labs`, ready: tableReady },
        { path: `/classes/${ids!.classId}/gradebook`, ready: tableReady },
        { path: `/classes/${ids!.classId}/students`, ready: tableReady },
        { path: `/labs/${ids!.threeWireLabId}/edit`, ready: (p) => p.getByTestId('script-validity').waitFor() },
        { path: `/labs/${ids!.forwardReverseLabId}/submissions`, ready: tableReady },
        { path: `/submissions/${ids!.submissionId}`, ready: (p) => p.getByTestId('grade-report').waitFor() },
        { path: '/overview' },
        { path: `/labs/${ids!.forwardReverseLabId}/similar` },
        { path: '/account' },
      ];
    case 'admin':
      return [
        { path: '/admin', ready: tableReady },
        { path: '/admin/mail' },
        { path: '/programs', ready: tableReady },
        {
          // An admin edits a lab but reads no student work: no way to the submissions is offered.
          path: `/labs/${ids!.threeWireLabId}/edit`,
          ready: async (p) => {
            await p.getByTestId('script-validity').waitFor();
            const offered = await p.getByRole('link', { name: 'Submissions' }).count();
            if (offered !== 0) throw new Error('the lab page offers an admin the submissions, which the server refuses them');
          },
        },
        { path: '/account' },
      ];
  }
}

const ACCOUNTS: Record<Exclude<Who, 'signed-out'>, DemoAccount> = { student: DEMO_STUDENTS[0]!, instructor: DEMO_INSTRUCTOR, admin: DEMO_ADMIN };

async function checkPages(who: Who, scheme: Scheme): Promise<void> {
  const context: BrowserContext = await suite.browser.newContext({ viewport: { width: 1280, height: 800 }, colorScheme: scheme });
  try {
    const page = who === 'signed-out' ? await context.newPage() : await signInThroughPage(context, suite.server.url, ACCOUNTS[who]);
    const ids = who === 'signed-out' ? null : await demoIds(page);
    const problems: string[] = [];
    for (const visit of visitsFor(who, ids)) {
      await page.goto(`${suite.server.url}${visit.path}`, { waitUntil: 'networkidle' });
      await visit.ready?.(page);
      const name = router.resolve(new URL(page.url()).pathname).name;
      if (typeof name === 'string') visitedRoutes.add(name);
      const label = `${scheme} ${who} ${visit.path}`;
      const findings = await axeFindings(page);
      report[label] = findings;
      const bad = failing(findings);
      if (bad.length > 0) {
        problems.push(describeFindings(label, bad));
        await page.screenshot({ path: `${SHOTS}/a11y-${scheme}-${who}-${visit.path.replace(/[^a-z0-9]+/gi, '-')}.png` });
      }
    }
    expect(problems.join('\n')).toBe('');
  } finally {
    await context.close();
  }
}

describe('accessibility of every page (axe-core, serious and critical)', () => {
  afterAll(() => {
    const counts = Object.fromEntries(
      Object.entries(report).map(([label, findings]) => [label, { failing: failing(findings).reduce((n, f) => n + f.nodes, 0), all: findings.reduce((n, f) => n + f.nodes, 0) }]),
    );
    writeFileSync(`${SHOTS}/accessibility.json`, JSON.stringify({ counts, report }, null, 2));
  });

  for (const scheme of SCHEMES) {
    for (const who of ['signed-out', 'student', 'instructor', 'admin'] as const) {
      it(`has no serious or critical violation ${who}, ${scheme} scheme`, () => checkPages(who, scheme), 120_000);
    }
  }

  it('visited every page of the route table', () => {
    const named = routes.map((r) => r.name).filter((n): n is string => typeof n === 'string');
    expect(named.length).toBeGreaterThan(10);
    expect([...visitedRoutes].sort()).toEqual([...named].sort());
  });
});
