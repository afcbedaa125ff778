/**
 * The admin page warns while demo accounts can sign in (their passwords are in the README): the
 * demo admin of a default start sees every demo account named and what to do, in light and dark.
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_ACCOUNTS, DEMO_ADMIN } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();

/** Waits for running CSS transitions and animations (naive-ui fades colours in). */
async function settle(page: Page): Promise<void> {
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running'));
}

describe('the admin page on a start with the demo data', () => {
  it('names the demo accounts that can sign in and says how to close them', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const problems: string[] = [];
    const page = await signInThroughPage(context, suite.server.url, DEMO_ADMIN);
    page.on('pageerror', (e) => problems.push(e.message));
    await page.goto(`${suite.server.url}/admin`, { waitUntil: 'networkidle' });
    const warning = page.getByTestId('demo-accounts-warning');
    await warning.waitFor();

    expect(await warning.locator('li').allInnerTexts()).toHaveLength(DEMO_ACCOUNTS.length);
    const text = (await warning.innerText()).replace(/\s+/g, ' ');
    expect(text).toContain('Demo accounts can still sign in');
    for (const account of DEMO_ACCOUNTS) expect(text).toContain(account.email);
    expect(text).toContain('as an administrator too');
    expect(text).toContain('DEMO=off');
    // The warning comes before the page's own first section.
    const [warningTop, inviteTop] = await Promise.all([warning.boundingBox(), page.getByRole('heading', { name: 'Invite an instructor' }).boundingBox()]);
    expect(warningTop!.y).toBeLessThan(inviteTop!.y);

    await settle(page);
    await page.screenshot({ path: `${SHOTS}/admin-demo-warning-light.png` });
    await page.getByRole('button', { name: 'Switch to dark colours' }).click();
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/admin-demo-warning-dark.png` });
    expect(problems).toEqual([]);
    await context.close();
  });
});
