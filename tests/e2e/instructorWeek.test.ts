/**
 * The instructor's week in a real browser: the demo instructor lands on the class overview, finds
 * students who have not started a lab, grades the forward/reverse lab's three submissions moving
 * with "Next student" and the keys N and P, returns them all with one note, opens the similar
 * submissions (with their caution), and downloads the gradebook CSV keyed by e-mail. Screenshots
 * at 1280×800 and 1920×1080.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { FORWARD_REVERSE, TWO_WIRE } from '@shared/labs';
import { DEMO_CLASS, DEMO_INSTRUCTOR, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
const NAMES = DEMO_STUDENTS.map((s) => s.name).sort((a, b) => a.localeCompare(b));

async function settle(page: Page): Promise<void> {
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running'));
}

async function shoot(page: Page, name: string): Promise<void> {
  await settle(page);
  await page.screenshot({ path: `${SHOTS}/${name}.png` });
}

/** Every refused API call and page error. */
function watch(page: Page, problems: string[]): void {
  page.on('pageerror', (e) => problems.push(e.message));
  page.on('response', async (response) => {
    if (response.url().includes('/api/') && response.status() >= 400) problems.push(`${response.request().method()} ${new URL(response.url()).pathname} ${response.status()}`);
  });
}

/**
 * Presses the page's Print (with the browser's dialog stubbed out: headless has none), then writes
 * the page as Chromium prints it: a PDF, and a screenshot in print media to look at.
 */
async function printToPdf(page: Page, name: string): Promise<void> {
  await page.evaluate(() => {
    window.print = () => undefined;
  });
  await page.getByRole('button', { name: /^Print/ }).first().click();
  await page.getByTestId('print-sheet').locator('img').waitFor({ state: 'attached' });
  const pdf = await page.pdf({ path: `${SHOTS}/${name}.pdf`, format: 'A4', printBackground: true, margin: { top: '15mm', bottom: '15mm', left: '12mm', right: '12mm' } });
  expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
  await page.emulateMedia({ media: 'print' });
  await page.screenshot({ path: `${SHOTS}/${name}-print-media.png`, fullPage: true });
  await page.emulateMedia({ media: 'screen' });
}

/** The student whose submission the review page shows. */
async function reviewedStudent(page: Page): Promise<string> {
  await page.getByRole('navigation', { name: 'Students of this lab' }).waitFor();
  return (await page.getByTestId('reviewed-student').innerText()).trim();
}

describe('the instructor’s week', () => {
  it('overview → who has not started → grade three with next/previous → return all → gradebook CSV', async () => {
    const problems: string[] = [];
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
    const page = await signInThroughPage(context, suite.server.url, DEMO_INSTRUCTOR);
    watch(page, problems);

    // ── The landing page: the class overview. ──
    expect(new URL(page.url()).pathname).toBe('/overview');
    const card = page.getByRole('region', { name: DEMO_CLASS.name });
    await card.getByRole('link', { name: FORWARD_REVERSE.title, exact: true }).waitFor();
    await shoot(page, 'overview-1280');
    await page.setViewportSize({ width: 1920, height: 1080 });
    await shoot(page, 'overview-1920');
    await page.setViewportSize({ width: 1280, height: 800 });

    // ── Who has not started the two-wire lab? ──
    await card.getByRole('link', { name: `3 students have not started in ${TWO_WIRE.title}` }).click();
    await page.waitForURL(/\/submissions\?show=not_started$/);
    const list = page.getByTestId('lab-students');
    await list.getByText(DEMO_STUDENTS[0]!.name).waitFor();
    expect(await list.getByText('not started').count()).toBe(3);
    await shoot(page, 'lab-students-not-started');

    // ── The forward/reverse lab: three to review. ──
    await page.goto(`${suite.server.url}/overview`, { waitUntil: 'networkidle' });
    await card.getByRole('row').filter({ has: page.getByRole('link', { name: FORWARD_REVERSE.title, exact: true }) }).getByRole('link', { name: '3 to review' }).click();
    await page.waitForURL(/\/submissions\?show=submitted$/);
    await list.getByRole('link', { name: 'Review' }).first().waitFor();
    await shoot(page, 'lab-students-to-review');
    await list.getByRole('link', { name: 'Review' }).first().click();

    // ── Grade three submissions: feedback on each, moving on with the button, then the keys. ──
    const seen: string[] = [];
    for (const [i, how] of (['button', 'key', 'last'] as const).entries()) {
      // The page shows the one before until the next one has loaded.
      await expect.poll(() => reviewedStudent(page)).not.toBe(seen.at(-1));
      const name = await reviewedStudent(page);
      seen.push(name);
      await page.getByLabel('Feedback').fill(`Checked by hand (${i + 1}).`);
      const saved = await page.getByText('Feedback saved.').count();
      await page.getByRole('button', { name: 'Save feedback' }).click();
      await expect.poll(() => page.getByText('Feedback saved.').count()).toBe(saved + 1);
      if (i === 0) await shoot(page, 'review-with-navigation');
      const url = page.url();
      if (how === 'button') await page.getByRole('button', { name: 'Next student →' }).click();
      else if (how === 'key') {
        await page.locator('body').click({ position: { x: 5, y: 5 } });
        await page.keyboard.press('n');
      } else break;
      await page.waitForURL((u) => u.toString() !== url);
    }
    expect(seen).toEqual(NAMES);
    expect(await page.getByRole('button', { name: 'Next student →' }).isDisabled()).toBe(true);
    // P goes back to the one before.
    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('p');
    await expect.poll(() => reviewedStudent(page)).toBe(NAMES[1]);

    // ── Print this submission: checked as a PDF (Chromium's page.pdf) and as a print-media screenshot. ──
    await printToPdf(page, 'print-submission');
    const sheet = page.getByTestId('print-sheet');
    for (const text of [NAMES[1]!, DEMO_CLASS.name, FORWARD_REVERSE.title, 'Version', 'Grade report', 'Tags', 'Rungs', 'K1_Coil']) expect(await sheet.innerText()).toContain(text);

    // ── Return all three with one note. ──
    await page.goBack();
    await page.goBack();
    await page.goto(`${suite.server.url}/overview`, { waitUntil: 'networkidle' });
    await card.getByRole('row').filter({ has: page.getByRole('link', { name: FORWARD_REVERSE.title, exact: true }) }).getByRole('link', { name: '3 to review' }).click();
    await page.getByRole('button', { name: 'Return all graded (3)' }).click();
    await page.getByLabel('Note for everyone').fill('Bring your printout to Thursday’s bench session.');
    await shoot(page, 'return-all-graded');
    await page.getByRole('dialog').getByRole('button', { name: 'Return 3 submissions' }).click();
    await page.getByText('3 submissions returned; each student gets an e-mail.').waitFor();
    await page.getByRole('radio', { name: /^Returned \(3\)$/ }).waitFor();

    // ── Similar submissions: two identical reference solutions; the caution is on the screen. ──
    await page.getByRole('link', { name: 'Similar submissions' }).click();
    await page.getByTestId('similarity-caution').getByText('never an accusation').waitFor();
    await page.getByRole('button', { name: 'Side by side' }).first().click();
    await page.getByRole('region', { name: 'Side by side' }).getByText('also in the other').first().waitFor();
    await shoot(page, 'similar-submissions');

    // ── The gradebook, its legend, and the CSV. ──
    await page.goto(`${suite.server.url}/overview`, { waitUntil: 'networkidle' });
    await card.getByRole('link', { name: 'Gradebook' }).click();
    await page.getByTestId('gradebook-legend').waitFor();
    await shoot(page, 'gradebook-1280');
    await page.setViewportSize({ width: 1920, height: 1080 });
    await shoot(page, 'gradebook-1920');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export CSV' }).click()]);
    const csv = readFileSync((await download.path())!, 'utf8');
    const rows = Papa.parse<string[]>(csv.trim()).data;
    expect(rows[0]!.slice(0, 2)).toEqual(['Email', 'Student']);
    const fr = rows[0]!.findIndex((h) => h.startsWith(FORWARD_REVERSE.title));
    expect(rows[0]!.slice(fr, fr + 3)).toEqual([expect.stringMatching(/\(\/\d+\)$/), `${FORWARD_REVERSE.title}: late days`, `${FORWARD_REVERSE.title}: late penalty %`]);
    const priya = rows.find((r) => r[0] === DEMO_STUDENTS[2]!.email)!;
    // Priya's submission came in after the due date: one day late, 10 % off.
    expect(priya.slice(fr + 1, fr + 3)).toEqual(['1', '10']);

    expect(problems).toEqual([]);
    await context.close();
  }, 240_000);

  it('prints a student’s own program with their name, class, lab, version, date, tags and rungs', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const ana = DEMO_STUDENTS[0]!;
    const page = await signInThroughPage(context, suite.server.url, ana);
    await page.getByRole('link', { name: 'Forward/reverse (demo)', exact: true }).click();
    await page.waitForURL(/\/programs\/[^/]+$/);
    await page.getByRole('button', { name: /^Print/ }).waitFor();
    await printToPdf(page, 'print-program');
    const text = await page.getByTestId('print-sheet').innerText();
    for (const part of [ana.name, DEMO_CLASS.name, FORWARD_REVERSE.title, 'Version', 'Printed', 'Tags', 'Rungs', 'Stop_PB']) expect(text).toContain(part);
    await context.close();
  }, 120_000);

  it('explains the simulator to a signed-out visitor, linked from the sign-in page, with only lab-sized demos', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    await page.goto(`${suite.server.url}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: 'Try the simulator without an account' }).click();
    await page.waitForURL(/\/simulator$/);
    const about = page.getByTestId('simulator-about');
    await about.getByText('Nothing is saved here.').waitFor();
    expect(await page.getByLabel('Demo program').locator('option').allInnerTexts()).toEqual(['Three-wire reversing (demo)', 'Two-wire (demo)']);
    await shoot(page, 'simulator-signed-out');
    await about.getByRole('link', { name: 'Sign in' }).click();
    await page.waitForURL(/\/sign-in$/);
    await context.close();
  }, 60_000);
});
