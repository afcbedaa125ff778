/**
 * The admin console in a real browser: the admin adds a student to the demo class by hand, reads
 * the invitation in the mailbox page and follows its link, looks at usage, invitations and the
 * backup, then deactivates a student whose open session is refused (401) from that moment.
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_ADMIN, DEMO_CLASS, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
const TOM = DEMO_STUDENTS[1]!;
const NEWCOMER = { email: 'iris.vale@larch-hollow.example', name: 'Iris Vale' };

async function settle(page: Page): Promise<void> {
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running'));
}

async function shoot(page: Page, name: string): Promise<void> {
  await settle(page);
  await page.screenshot({ path: `${SHOTS}/${name}.png` });
}

/** Every refused API call and page error. */
function watch(page: Page, who: string, problems: string[]): void {
  page.on('pageerror', (e) => problems.push(`${who}: ${e.message}`));
  page.on('response', async (response) => {
    if (response.url().includes('/api/') && response.status() >= 400) problems.push(`${who}: ${response.request().method()} ${new URL(response.url()).pathname} ${response.status()}`);
  });
}

const meStatus = (page: Page) => page.evaluate(async () => (await fetch('/api/me')).status);

describe('the admin console', () => {
  it('adds a student by invitation, reads it in the mailbox page, and deactivates an account whose open session then gets 401', async () => {
    const problems: string[] = [];
    for (const viewport of [{ width: 1280, height: 800 }, { width: 1920, height: 1080 }]) {
      const context = await suite.browser.newContext({ viewport });
      const page = await signInThroughPage(context, suite.server.url, DEMO_ADMIN);
      expect(new URL(page.url()).pathname).toBe('/admin');
      await page.getByTestId('accounts').getByText(TOM.email).waitFor();
      await shoot(page, `admin-console-accounts-${viewport.width}`);
      await context.close();
    }

    const studentContext = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const student = await signInThroughPage(studentContext, suite.server.url, TOM);
    expect(await meStatus(student)).toBe(200);

    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const admin = await signInThroughPage(context, suite.server.url, DEMO_ADMIN);
    watch(admin, 'admin', problems);

    // ── Add one student to the demo class by hand: an invitation. ──
    await admin.getByRole('navigation', { name: 'Administration' }).getByRole('link', { name: 'Invitations' }).click();
    await admin.locator('[aria-label="Class"]').click();
    await admin.locator('.n-base-select-option', { hasText: DEMO_CLASS.name }).click();
    await admin.getByLabel('Student e-mail').fill(NEWCOMER.email);
    await admin.getByLabel('Student name').fill(NEWCOMER.name);
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await admin.getByTestId('roster-invitation-sent').waitFor();
    await admin.getByTestId('invitations').getByText(NEWCOMER.email).waitFor();
    await shoot(admin, 'admin-console-invitations');

    // ── Read it in the mailbox page, search, open, follow the link. ──
    await admin.getByRole('link', { name: 'Open the mailbox' }).click();
    await admin.waitForURL(/\/admin\/mail$/);
    await admin.getByLabel('Search the mailbox').fill('iris.vale');
    await admin.getByRole('button', { name: `You are invited to ${DEMO_CLASS.name}` }).click();
    const message = admin.getByRole('article', { name: 'Message' });
    await message.getByText('You have been invited to join the class').waitFor();
    expect(await message.innerText()).not.toMatch(/\d{4}-\d\d-\d\dT\d\d:\d\d/);
    await shoot(admin, 'admin-mailbox-message');
    await message.getByRole('link', { name: /\/accept-invitation#token=/ }).click();
    await admin.waitForURL(/\/accept-invitation/);
    await admin.getByText(NEWCOMER.email).first().waitFor();
    await shoot(admin, 'admin-mailbox-followed-link');

    // ── Usage and backup. ──
    await admin.goto(`${suite.server.url}/admin?tab=usage`, { waitUntil: 'networkidle' });
    await admin.getByText('Active students this week').waitFor();
    await admin.locator('.chart canvas').first().waitFor();
    await shoot(admin, 'admin-console-usage');
    await admin.getByRole('navigation', { name: 'Administration' }).getByRole('link', { name: 'Backup' }).click();
    const [download] = await Promise.all([admin.waitForEvent('download'), admin.getByRole('link', { name: 'Download a backup' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^rungwright-backup-.*\.tar\.gz$/);
    await shoot(admin, 'admin-console-backup');

    // ── Deactivate Tom: his open session is refused at once. ──
    await admin.getByRole('navigation', { name: 'Administration' }).getByRole('link', { name: 'Accounts' }).click();
    await admin.getByRole('button', { name: `Deactivate ${TOM.email}` }).click();
    await admin.getByRole('dialog').getByRole('button', { name: 'Deactivate' }).click();
    await admin.getByRole('button', { name: `Reactivate ${TOM.email}` }).waitFor();
    expect(await meStatus(student)).toBe(401);

    expect(problems).toEqual([]);
    await studentContext.close();
    await context.close();
  }, 180_000);
});
