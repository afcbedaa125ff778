/**
 * Sessions on a shared lab computer, in a real browser: a student signs out and the next student
 * at the same browser sees nothing of theirs, even with Back and a reload; a student changes their
 * password on the account page (screenshots in light and dark colours); an administrator
 * deactivates and reactivates an account.
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_ADMIN, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { REVERSING_DEMO, THREE_WIRE_DEMO } from '../../server/db/demoPrograms';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
const VIEWPORT = { width: 1280, height: 800 };
const [ANA, TOM, PRIYA] = DEMO_STUDENTS as [(typeof DEMO_STUDENTS)[number], (typeof DEMO_STUDENTS)[number], (typeof DEMO_STUDENTS)[number]];

/** Waits for running CSS transitions and animations (naive-ui fades colours, dialogs and messages in). */
async function settle(page: Page): Promise<void> {
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running'));
}

async function shoot(page: Page, name: string): Promise<void> {
  await settle(page);
  await page.screenshot({ path: `${SHOTS}/${name}` });
}

/** What `GET /api/me` answers this browser now. */
const meStatus = (page: Page) => page.evaluate(async () => (await fetch('/api/me')).status);

/** Nothing of Ana's anywhere on the page: her name, her programs' titles. */
async function expectNothingOfAna(page: Page): Promise<void> {
  const text = await page.locator('body').innerText();
  expect(text).not.toContain(ANA.name);
  expect(text).not.toContain(REVERSING_DEMO.title);
}

describe('signing out on a shared computer', () => {
  it('ends the session for good, and the next student sees nothing of the last one', async () => {
    const context = await suite.browser.newContext({ viewport: VIEWPORT });
    const page = await signInThroughPage(context, suite.server.url, ANA);
    await page.getByRole('link', { name: REVERSING_DEMO.title }).waitFor();
    expect(await page.getByRole('link', { name: THREE_WIRE_DEMO.title }).isVisible()).toBe(true);
    expect(await page.getByRole('link', { name: /Your account/ }).innerText()).toBe(ANA.name);
    await shoot(page, 'sessions-1-first-student-programs.png');
    // One more page, so the browser's history holds a page of Ana's behind the sign-out.
    await page.getByRole('link', { name: 'Classes', exact: true }).click();
    await page.waitForURL(/\/classes$/);

    await page.getByRole('button', { name: 'Sign out', exact: true }).click();
    await page.waitForURL(/\/sign-in$/);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(await meStatus(page)).toBe(401);
    await expectNothingOfAna(page);
    await shoot(page, 'sessions-2-signed-out.png');

    // Back does not bring the last student's page back, and neither does a reload.
    await page.goBack();
    await expect.poll(() => page.url()).toMatch(/\/sign-in\?next=(\/|%2F)programs$/);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    await expectNothingOfAna(page);
    await page.reload({ waitUntil: 'networkidle' });
    await expect.poll(() => page.url()).toMatch(/\/sign-in/);
    expect(await page.getByRole('button', { name: 'Sign in' }).isVisible()).toBe(true);
    await page.goto(`${suite.server.url}/programs`, { waitUntil: 'networkidle' });
    await expect.poll(() => page.url()).toMatch(/\/sign-in\?next=/);

    // The next student, in the same browser.
    await page.getByLabel('E-mail').fill(PRIYA.email);
    await page.getByLabel('Password').fill(PRIYA.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    // The path, not the address: the sign-in page's own address ends in "next=/programs".
    await page.waitForURL((url) => url.pathname === '/programs');
    // The table shows exactly what the server says is Priya's, and none of Ana's.
    const listed = await page.evaluate(async () => (await fetch('/api/programs')).json() as Promise<{ programs?: { title: string }[] }>);
    expect(listed).toEqual({ programs: expect.any(Array) });
    const own = (listed.programs ?? []).map((p) => p.title);
    expect(own).not.toContain(REVERSING_DEMO.title);
    await (own[0] ? page.getByRole('link', { name: own[0] }) : page.getByText('Nothing here yet')).waitFor();
    expect(await page.locator('tbody a[href^="/programs/"]').allInnerTexts()).toEqual(own);
    expect(await page.getByRole('link', { name: /Your account/ }).innerText()).toBe(PRIYA.name);
    await expectNothingOfAna(page);
    expect(await page.locator('body').innerText()).not.toContain(THREE_WIRE_DEMO.title);
    await shoot(page, 'sessions-3-next-student-programs.png');
    await context.close();
  });

  it('stays signed out after "Sign out everywhere", on another computer too', async () => {
    const lab = await suite.browser.newContext({ viewport: VIEWPORT });
    const home = await suite.browser.newContext({ viewport: VIEWPORT });
    const labPage = await signInThroughPage(lab, suite.server.url, TOM);
    const homePage = await signInThroughPage(home, suite.server.url, TOM);
    await homePage.getByRole('link', { name: /Your account/ }).click();
    await homePage.waitForURL(/\/account$/);
    await homePage.getByRole('button', { name: 'Sign out everywhere' }).click();
    await homePage.getByRole('dialog').getByRole('button', { name: 'Sign out everywhere' }).click();
    await homePage.waitForURL(/\/sign-in$/);
    expect(await meStatus(homePage)).toBe(401);
    expect(await meStatus(labPage)).toBe(401);
    // The lab computer's next request is answered as signed out, and the page says so.
    await labPage.getByRole('link', { name: 'Classes' }).click();
    await labPage.waitForURL(/\/sign-in/);
    await lab.close();
    await home.close();
  });
});

describe('the account page', () => {
  it('changes the password with the current one, and says what is wrong under the field', async () => {
    const context = await suite.browser.newContext({ viewport: VIEWPORT });
    const page = await signInThroughPage(context, suite.server.url, TOM);
    await page.getByRole('link', { name: /Your account/ }).click();
    await page.waitForURL(/\/account$/);
    await page.getByRole('heading', { name: 'Your account' }).waitFor();
    expect(await page.getByText(TOM.email).isVisible()).toBe(true);
    await shoot(page, 'account-light.png');

    await page.getByLabel('Current password').fill('not-my-password');
    await page.getByLabel('New password', { exact: true }).fill('a-newer-password-7');
    await page.getByLabel('New password again').fill('a-newer-password-7');
    await page.getByRole('button', { name: 'Change password' }).click();
    await page.getByText('is not your current password').waitFor();
    await shoot(page, 'account-wrong-current-light.png');

    await page.getByLabel('Current password').fill(TOM.password);
    await page.getByRole('button', { name: 'Change password' }).click();
    await page.getByTestId('password-changed').waitFor();
    // Still signed in here, under the re-issued session.
    expect(await meStatus(page)).toBe(200);
    await shoot(page, 'account-changed-light.png');
    await page.getByRole('button', { name: 'Switch to dark colours' }).click();
    await shoot(page, 'account-changed-dark.png');
    await page.getByRole('button', { name: 'Switch to light colours' }).click();

    await page.getByRole('button', { name: 'Sign out', exact: true }).click();
    await page.waitForURL(/\/sign-in$/);
    await page.getByLabel('E-mail').fill(TOM.email);
    await page.getByLabel('Password').fill(TOM.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('The e-mail or password is wrong').waitFor();
    await page.getByLabel('Password').fill('a-newer-password-7');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => url.pathname === '/programs');
    await context.close();
  });
});

describe('an administrator deactivating an account', () => {
  it('signs the student out at once, refuses their sign-in with a clear message, and lets them back once reactivated', async () => {
    const studentContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const adminContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const student = await signInThroughPage(studentContext, suite.server.url, PRIYA);
    const admin = await signInThroughPage(adminContext, suite.server.url, DEMO_ADMIN);
    await admin.getByRole('link', { name: 'Administration' }).click();
    await admin.waitForURL(/\/admin$/);
    await admin.getByRole('button', { name: `Deactivate ${PRIYA.email}` }).click();
    await admin.getByRole('dialog').getByRole('button', { name: 'Deactivate' }).click();
    await admin.getByRole('button', { name: `Reactivate ${PRIYA.email}` }).waitFor();
    // The administrator's own account cannot be deactivated from here.
    expect(await admin.getByRole('button', { name: `Deactivate ${DEMO_ADMIN.email}` }).isDisabled()).toBe(true);
    await shoot(admin, 'admin-accounts-deactivated.png');

    expect(await meStatus(student)).toBe(401);
    await student.getByRole('link', { name: 'Classes' }).click();
    await student.waitForURL(/\/sign-in/);
    await student.getByLabel('E-mail').fill(PRIYA.email);
    await student.getByLabel('Password').fill(PRIYA.password);
    await student.getByRole('button', { name: 'Sign in' }).click();
    await student.getByText('This account has been deactivated').waitFor();
    await shoot(student, 'sign-in-deactivated.png');

    await admin.getByRole('button', { name: `Reactivate ${PRIYA.email}` }).click();
    await admin.getByRole('button', { name: `Deactivate ${PRIYA.email}` }).waitFor();
    await student.getByRole('button', { name: 'Sign in' }).click();
    await student.waitForURL((url) => url.pathname === '/classes');
    await studentContext.close();
    await adminContext.close();
  });
});
