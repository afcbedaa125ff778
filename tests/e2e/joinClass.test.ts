/**
 * Joining a class with its join code in a real browser: the page answers "check your e-mail" for
 * every address; a new address finishes from the mailed link (choosing its password) and lands in
 * the class; an address with an account gets the same answer and a mail that says so. Mail is read
 * from the local fake mailbox, as the demo admin.
 */
import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { SentMailEntry } from '@shared/api/mail';
import { DEMO_ADMIN, DEMO_CLASS, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
const VIEWPORT = { width: 1280, height: 800 };
const KAI = { email: 'kai.ortiz@larch-hollow.example', name: 'Kai Ortiz', password: 'sawmill-shift-7' };

/** Every refused API call and page error, except the ones a step expects. */
function watch(page: Page, who: string, problems: string[], expected: RegExp[] = []): void {
  page.on('pageerror', (e) => problems.push(`${who}: ${e.message}`));
  page.on('response', async (response) => {
    const call = `${response.request().method()} ${new URL(response.url()).pathname} ${response.status()}`;
    if (response.url().includes('/api/') && response.status() >= 400 && !expected.some((e) => e.test(call))) {
      problems.push(`${who}: ${call} ${await response.text().catch(() => '')}`);
    }
  });
}

async function shoot(page: Page, name: string): Promise<void> {
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running'));
  await page.screenshot({ path: `${SHOTS}/${name}` });
}

async function mailTo(admin: Page, address: string): Promise<SentMailEntry[]> {
  const { mail } = await admin.evaluate(async () => (await (await fetch('/api/dev/mail')).json()) as { mail: SentMailEntry[] });
  return mail.filter((m) => m.to.toLowerCase().includes(address.toLowerCase()));
}

/** Fills the "Join a class" form and sends it; answers the page. */
async function askToJoin(context: BrowserContext, who: { email: string; name: string }, joinCode: string = DEMO_CLASS.joinCode): Promise<Page> {
  const page = await context.newPage();
  await page.goto(`${suite.server.url}/join`, { waitUntil: 'networkidle' });
  await page.getByLabel('Join code').fill(joinCode);
  await page.getByLabel('Your name').fill(who.name);
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByRole('button', { name: 'E-mail me the link' }).click();
  return page;
}

// Signed out, the app's first `GET /api/me` answers 401 (nobody).
const SIGNED_OUT = [/^GET \/api\/me 401/];

describe('joining a class with its join code in a real browser', () => {
  it('answers "check your e-mail", and the mailed link sets the password and lands in the class', async () => {
    const problems: string[] = [];
    const kaiContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const darkContext = await suite.browser.newContext({ viewport: VIEWPORT, colorScheme: 'dark' });
    const adminContext = await suite.browser.newContext({ viewport: VIEWPORT });

    // ── A mistyped code is named under its field; nothing is sent. ──
    const wrong = await askToJoin(kaiContext, KAI, 'ZZZZ-ZZZZ');
    watch(wrong, 'kai (wrong code)', problems, [...SIGNED_OUT, /^POST \/api\/auth\/sign-up 400/]);
    await wrong.getByText('no class has this join code').waitFor();
    await shoot(wrong, 'join-class-wrong-code-light.png');
    await wrong.close();

    // ── The right code: "check your e-mail", the same for every address. ──
    const kai = await askToJoin(kaiContext, KAI);
    watch(kai, 'kai', problems, SIGNED_OUT);
    await kai.getByTestId('sign-up-sent').waitFor();
    const sentText = await kai.getByTestId('sign-up-sent').innerText();
    expect(sentText).toMatch(/^Check your e-mail: /);
    expect(sentText).toContain(`It went to ${KAI.email}.`);
    await shoot(kai, 'join-class-sent-light.png');
    const dark = await askToJoin(darkContext, { email: 'someone.else@larch-hollow.example', name: 'Someone Else' });
    await dark.getByTestId('sign-up-sent').waitFor();
    await shoot(dark, 'join-class-sent-dark.png');

    // ── The link from the mail: who joins what, then the password. ──
    const admin = await signInThroughPage(adminContext, suite.server.url, DEMO_ADMIN);
    await expect.poll(async () => (await mailTo(admin, KAI.email)).length, { timeout: 10_000 }).toBe(1);
    const [mail] = await mailTo(admin, KAI.email);
    expect(mail!.subject).toBe('Finish creating your Rungwright account');
    const link = mail!.text.match(/https?:\/\/\S+\/join\/finish#token=[\w-]+/)?.[0];
    expect(link).toBeTruthy();

    await kai.goto(link!, { waitUntil: 'networkidle' });
    expect(await kai.getByTestId('sign-up-summary').innerText()).toBe(`${KAI.email} joins the class “${DEMO_CLASS.name}” as a student.`);
    expect(await kai.getByLabel('Your name').inputValue()).toBe(KAI.name);
    await kai.getByLabel('Password').fill('short');
    await kai.getByRole('button', { name: 'Create my account' }).click();
    await kai.getByText('a password needs at least 10 characters').waitFor();
    await shoot(kai, 'join-finish-light.png');
    await dark.goto(link!, { waitUntil: 'networkidle' });
    await dark.getByTestId('sign-up-summary').waitFor();
    await shoot(dark, 'join-finish-dark.png');

    await kai.getByLabel('Password').fill(KAI.password);
    await kai.getByRole('button', { name: 'Create my account' }).click();
    await kai.waitForURL(/\/classes\/[^/]+\/labs$/);
    await expect.poll(() => kai.locator('h1').innerText()).toContain(DEMO_CLASS.name);
    const me = await kai.evaluate(async () => (await (await fetch('/api/me')).json()) as { user: { email: string; name: string; role: string } });
    expect(me.user).toMatchObject({ email: KAI.email, name: KAI.name, role: 'student' });

    // ── The link works once. ──
    await dark.reload({ waitUntil: 'networkidle' });
    await dark.getByText('This sign-up link cannot be used').waitFor();
    await shoot(dark, 'join-finish-used-dark.png');

    expect(problems).toEqual([]);
    await Promise.all([kaiContext.close(), darkContext.close(), adminContext.close()]);
  }, 180_000);

  it('gives an address with an account the same answer, and mails it that it has one', async () => {
    const problems: string[] = [];
    const context = await suite.browser.newContext({ viewport: VIEWPORT });
    const adminContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const ana = DEMO_STUDENTS[0]!;

    const existing = await askToJoin(context, { email: ana.email.toUpperCase(), name: 'Ana again' });
    watch(existing, 'ana', problems, SIGNED_OUT);
    await existing.getByTestId('sign-up-sent').waitFor();
    const fresh = await askToJoin(context, { email: 'nobody.yet@larch-hollow.example', name: 'Nobody Yet' });
    watch(fresh, 'nobody', problems, SIGNED_OUT);
    await fresh.getByTestId('sign-up-sent').waitFor();
    const answer = async (page: Page) => (await page.getByTestId('sign-up-sent').innerText()).replace(/It went to \S+\./, 'It went to …');
    expect(await answer(existing)).toBe(await answer(fresh));

    const admin = await signInThroughPage(adminContext, suite.server.url, DEMO_ADMIN);
    await expect.poll(async () => (await mailTo(admin, ana.email.toUpperCase())).map((m) => m.subject), { timeout: 10_000 }).toEqual(['You already have a Rungwright account']);
    const [mail] = await mailTo(admin, ana.email.toUpperCase());
    expect(mail!.text).toMatch(/sign in, open Classes and enter the join code/);
    expect(mail!.text).not.toMatch(/#token=/);

    expect(problems).toEqual([]);
    await Promise.all([context.close(), adminContext.close()]);
  }, 120_000);
});
