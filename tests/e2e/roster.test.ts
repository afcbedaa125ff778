/**
 * Rosters and invitations in a real browser: the demo instructor uploads a roster to the demo
 * class, the invited person accepts from the e-mailed link and lands in the class, the instructor
 * removes them again; the admin invites an instructor. Mail is read from the local fake mailbox.
 */
import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { SentMailEntry } from '@shared/api/mail';
import { DEMO_ADMIN, DEMO_CLASS, DEMO_INSTRUCTOR } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
const VIEWPORT = { width: 1280, height: 800 };
const NEWCOMER = { email: 'lee.moss@larch-hollow.example', name: 'Lee Moss', password: 'conveyor-belt-42' };
const ROSTER_CSV = `email,name\n${NEWCOMER.email},${NEWCOMER.name}\nnot-an-address,Rowan Pike\n`;

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

const signIn = (context: BrowserContext, account: { email: string; password: string }): Promise<Page> => signInThroughPage(context, suite.server.url, account);

/** Waits for running CSS transitions and animations (naive-ui fades colours, dialogs and field messages in). */
async function settle(page: Page): Promise<void> {
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running'));
}

async function shoot(page: Page, path: string): Promise<void> {
  await settle(page);
  await page.screenshot({ path: `${SHOTS}/${path}` });
}

/** Switches the colours with the header's button. */
async function useColours(page: Page, scheme: 'light' | 'dark'): Promise<void> {
  await page.getByRole('button', { name: `Switch to ${scheme} colours` }).click();
  await settle(page);
}

/** A light and a dark screenshot of a signed-in page. */
async function shootBoth(page: Page, name: string): Promise<void> {
  await shoot(page, `${name}-light.png`);
  await useColours(page, 'dark');
  await shoot(page, `${name}-dark.png`);
  await useColours(page, 'light');
}

async function mailTo(admin: Page, address: string): Promise<SentMailEntry[]> {
  const { mail } = await admin.evaluate(async () => (await (await fetch('/api/dev/mail')).json()) as { mail: SentMailEntry[] });
  return mail.filter((m) => m.to.includes(address));
}

function invitationLink(mail: SentMailEntry): string {
  const link = mail.text.match(/https?:\/\/\S+\/accept-invitation#token=[\w-]+/)?.[0];
  if (!link) throw new Error(`no invitation link in: ${mail.text}`);
  return link;
}

describe('class rosters and invitations in a real browser', () => {
  it('uploads a roster, the invited student accepts and lands in the class, and the instructor removes them', async () => {
    const problems: string[] = [];
    const teacherContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const adminContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const newcomerContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const darkContext = await suite.browser.newContext({ viewport: VIEWPORT, colorScheme: 'dark' });

    // ── The instructor opens the demo class's roster from the Classes page. ──
    const teacher = await signIn(teacherContext, DEMO_INSTRUCTOR);
    watch(teacher, 'instructor', problems);
    await teacher.goto(`${suite.server.url}/classes`, { waitUntil: 'networkidle' });
    const rosterLink = teacher.getByRole('row', { name: DEMO_CLASS.name }).getByRole('link', { name: '3 students: open the roster' });
    await rosterLink.waitFor();
    await shootBoth(teacher, 'classes-roster-link');
    await rosterLink.click();
    await teacher.waitForURL(/\/classes\/[^/]+\/students$/);
    const classId = teacher.url().split('/').slice(-2)[0]!;
    await expect.poll(() => teacher.getByTestId('roster-students').innerText()).toMatch(/Ana Reyes/);
    expect(await teacher.getByTestId('roster-students').innerText()).not.toMatch(/Lee Moss/);

    // ── Upload: one new address, one bad row; the report shows four groups. ──
    await teacher.setInputFiles('input[aria-label="Roster CSV file"]', { name: 'motor-control-roster.csv', mimeType: 'text/csv', buffer: Buffer.from(ROSTER_CSV) });
    await teacher.getByTestId('roster-report').waitFor();
    expect(await teacher.getByTestId('roster-invited').innerText()).toMatch(/^Invited 1[\s\S]*line 2[\s\S]*Lee Moss · lee\.moss@larch-hollow\.example/);
    expect(await teacher.getByTestId('roster-rejected').innerText()).toMatch(/^Rejected 1[\s\S]*line 3[\s\S]*not-an-address[\s\S]*not a valid e-mail address/);
    expect(await teacher.getByTestId('roster-added').innerText()).toMatch(/^Enrolled now 0/);
    expect(await teacher.getByTestId('roster-already').innerText()).toMatch(/^Already in 0/);
    await expect.poll(() => teacher.getByTestId('roster-invitations').innerText()).toMatch(/lee\.moss@larch-hollow\.example[\s\S]*Lee Moss/);
    await teacher.getByTestId('roster-report').scrollIntoViewIfNeeded();
    await shootBoth(teacher, 'roster-uploaded');

    // ── The invitation mail arrived; its link opens the accept page. ──
    const admin = await signIn(adminContext, DEMO_ADMIN);
    watch(admin, 'admin', problems, [/instructor-invitations 409/]);
    await expect.poll(async () => (await mailTo(admin, NEWCOMER.email)).length, { timeout: 10_000 }).toBe(1);
    const [invitation] = await mailTo(admin, NEWCOMER.email);
    expect(invitation!.subject).toBe(`You are invited to ${DEMO_CLASS.name}`);
    const link = invitationLink(invitation!);

    const darkPage = await darkContext.newPage();
    // Signed out: the app's first `GET /api/me` answers 401 (nobody), and a used link's lookup 400.
    const signedOut = [/^GET \/api\/me 401/, /invitations\/lookup 400/];
    watch(darkPage, 'newcomer (dark)', problems, signedOut);
    await darkPage.goto(link, { waitUntil: 'networkidle' });
    await darkPage.getByTestId('invitation-summary').waitFor();
    await shoot(darkPage, 'accept-invitation-dark.png');

    const newcomer = await newcomerContext.newPage();
    watch(newcomer, 'newcomer', problems, signedOut);
    await newcomer.goto(link, { waitUntil: 'networkidle' });
    expect(await newcomer.getByTestId('invitation-summary').innerText()).toBe(`${NEWCOMER.email} is invited to join the class “${DEMO_CLASS.name}” as a student.`);
    expect(await newcomer.getByLabel('Your name').inputValue()).toBe(NEWCOMER.name);
    await newcomer.getByLabel('Password').fill('short');
    await newcomer.getByRole('button', { name: 'Set my password and sign in' }).click();
    await newcomer.getByText('a password needs at least 10 characters').waitFor();
    await shoot(newcomer, 'accept-invitation-light.png');
    await newcomer.getByLabel('Password').fill(NEWCOMER.password);
    await newcomer.getByRole('button', { name: 'Set my password and sign in' }).click();

    // ── Signed in and enrolled: the class's labs page, and the session says who. ──
    await newcomer.waitForURL(new RegExp(`/classes/${classId}/labs$`));
    const me = await newcomer.evaluate(async () => (await (await fetch('/api/me')).json()) as { user: { email: string; name: string; role: string } });
    expect(me.user).toMatchObject({ email: NEWCOMER.email, name: NEWCOMER.name, role: 'student' });
    await expect.poll(() => newcomer.locator('h1').innerText()).toContain(DEMO_CLASS.name);
    expect(await newcomer.getByRole('link', { name: 'Students' }).count()).toBe(0);

    // The link works once: opening it again says so and offers a way forward.
    await newcomer.goto(link, { waitUntil: 'networkidle' });
    await newcomer.getByText('This invitation link cannot be used').waitFor();
    expect(await newcomer.locator('.n-card').innerText()).toMatch(/sign in[\s\S]*ask your instructor/i);
    await shoot(newcomer, 'accept-invitation-used-light.png');
    await darkPage.reload({ waitUntil: 'networkidle' });
    await darkPage.getByText('This invitation link cannot be used').waitFor();
    await shoot(darkPage, 'accept-invitation-used-dark.png');

    // ── The instructor sees the new student, no open invitation, and removes them after confirming. ──
    await teacher.reload({ waitUntil: 'networkidle' });
    await expect.poll(() => teacher.getByTestId('roster-students').innerText()).toMatch(/Lee Moss[\s\S]*lee\.moss@larch-hollow\.example/);
    expect(await teacher.getByTestId('roster-invitations').innerText()).not.toMatch(/lee\.moss/);
    const dialog = teacher.getByRole('dialog');
    const askToRemove = async () => {
      await teacher.getByRole('button', { name: `Remove ${NEWCOMER.name}` }).click();
      await dialog.waitFor();
    };
    // The dialog covers the header's colours button: close it ("Keep" changes nothing), switch, ask again.
    await askToRemove();
    expect(await dialog.innerText()).toMatch(/Remove Lee Moss from the class\?[\s\S]*lee\.moss@larch-hollow\.example[\s\S]*work they submitted are kept/);
    await shoot(teacher, 'roster-remove-dialog-light.png');
    await dialog.getByRole('button', { name: 'Keep' }).click();
    await dialog.waitFor({ state: 'detached' });
    await useColours(teacher, 'dark');
    await askToRemove();
    await shoot(teacher, 'roster-remove-dialog-dark.png');
    await dialog.getByRole('button', { name: 'Keep' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(await teacher.getByTestId('roster-students').innerText()).toMatch(/Lee Moss/);
    await useColours(teacher, 'light');
    await askToRemove();
    await dialog.getByRole('button', { name: 'Remove from class' }).click();
    await expect.poll(() => teacher.getByTestId('roster-students').innerText()).not.toMatch(/Lee Moss/);
    const theirClasses = await newcomer.evaluate(async () => ((await (await fetch('/api/classes')).json()) as { classes: unknown[] }).classes.length);
    expect(theirClasses).toBe(0);

    // ── The labs page links to the roster for staff only. ──
    await teacher.goto(`${suite.server.url}/classes/${classId}/labs`, { waitUntil: 'networkidle' });
    await shoot(teacher, 'class-labs-staff-light.png');
    await teacher.getByRole('link', { name: 'Students' }).click();
    await teacher.waitForURL(new RegExp(`/classes/${classId}/students$`));

    expect(problems).toEqual([]);
    await Promise.all([teacherContext.close(), adminContext.close(), newcomerContext.close(), darkContext.close()]);
  }, 180_000);

  it('lets the admin invite an instructor, shows a refused address under the field, and the mail arrives', async () => {
    const problems: string[] = [];
    const context = await suite.browser.newContext({ viewport: VIEWPORT });
    const admin = await signIn(context, DEMO_ADMIN);
    watch(admin, 'admin', problems, [/instructor-invitations 409/]);
    await admin.goto(`${suite.server.url}/admin`, { waitUntil: 'networkidle' });

    await admin.getByLabel('Instructor e-mail').fill(DEMO_INSTRUCTOR.email);
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await admin.getByText('already has an account').waitFor();
    await admin.getByLabel('Instructor e-mail').fill('not an address');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await admin.getByText('not a valid e-mail address').waitFor();
    await shootBoth(admin, 'admin-invite-error');

    const invitee = 'rhea.holt@larch-hollow.example';
    await admin.getByLabel('Instructor e-mail').fill(invitee);
    await admin.getByLabel('Instructor name').fill('Rhea Holt');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => admin.getByTestId('invitation-sent').innerText()).toMatch(/^Invitation sent to rhea\.holt@larch-hollow\.example\. The link expires /);
    await shootBoth(admin, 'admin-invite-sent');

    await expect.poll(async () => (await mailTo(admin, invitee)).map((m) => m.subject), { timeout: 10_000 }).toEqual(['Your Rungwright invitation']);
    const [mail] = await mailTo(admin, invitee);
    const page = await context.newPage();
    watch(page, 'invitee', problems);
    await page.goto(invitationLink(mail!), { waitUntil: 'networkidle' });
    expect(await page.getByTestId('invitation-summary').innerText()).toBe(`${invitee} is invited to teach on Rungwright as an instructor.`);
    expect(await page.getByLabel('Your name').inputValue()).toBe('Rhea Holt');

    expect(problems).toEqual([]);
    await context.close();
  }, 120_000);
  it('names a roster without its header line, and sends someone who got an account meanwhile to sign in', async () => {
    const problems: string[] = [];
    const context = await suite.browser.newContext({ viewport: VIEWPORT });
    const teacher = await signIn(context, DEMO_INSTRUCTOR);
    watch(teacher, 'instructor', problems, [/\/roster 400/]);
    await teacher.goto(`${suite.server.url}/classes`, { waitUntil: 'networkidle' });
    await teacher.getByRole('row', { name: DEMO_CLASS.name }).getByRole('link', { name: /students: open the roster$/ }).click();
    await teacher.waitForURL(/\/students$/);

    await teacher.setInputFiles('input[aria-label="Roster CSV file"]', { name: 'no-header.csv', mimeType: 'text/csv', buffer: Buffer.from('kai.ortiz@larch-hollow.example,Kai Ortiz\n') });
    await expect.poll(() => teacher.getByRole('alert').innerText()).toMatch(/^no-header\.csv: The roster needs a header line "email,name"/);
    expect(await teacher.getByTestId('roster-report').count()).toBe(0);

    const kai = { email: 'kai.ortiz@larch-hollow.example', name: 'Kai Ortiz', password: 'sawmill-shift-7' };
    await teacher.setInputFiles('input[aria-label="Roster CSV file"]', { name: 'kai.csv', mimeType: 'text/csv', buffer: Buffer.from(`email,name\n${kai.email},${kai.name}\n`) });
    await expect.poll(() => teacher.getByTestId('roster-invited').innerText()).toMatch(/^Invited 1/);

    // Kai signs up with the join code before opening the invitation.
    const visitor = await suite.browser.newContext({ viewport: VIEWPORT });
    const page = await visitor.newPage();
    watch(page, 'kai', problems, [/^GET \/api\/me 401/, /invitations\/accept 409/]);
    await page.goto(`${suite.server.url}/join`, { waitUntil: 'networkidle' });
    await page.getByLabel('Join code').fill(DEMO_CLASS.joinCode);
    await page.getByLabel('Your name').fill(kai.name);
    await page.getByLabel('E-mail').fill(kai.email);
    await page.getByLabel('Password').fill(kai.password);
    await page.getByRole('button', { name: 'Create my account' }).click();
    await page.waitForURL(/\/programs$/);
    // Leave the signed-in page first: signed out under it, its reads would answer 401.
    await page.goto('about:blank');
    await visitor.clearCookies();

    const adminContext = await suite.browser.newContext();
    const admin = await signIn(adminContext, DEMO_ADMIN);
    await expect.poll(async () => (await mailTo(admin, kai.email)).length, { timeout: 10_000 }).toBe(1);
    await page.goto(invitationLink((await mailTo(admin, kai.email))[0]!), { waitUntil: 'networkidle' });
    await page.getByLabel('Password').fill(kai.password);
    await page.getByRole('button', { name: 'Set my password and sign in' }).click();
    await expect.poll(() => page.getByRole('alert').innerText()).toBe('An account with this e-mail exists already; sign in instead.');
    await page.getByRole('link', { name: 'Sign in', exact: true }).waitFor();
    await shoot(page, 'accept-invitation-has-account-light.png');

    expect(problems).toEqual([]);
    await Promise.all([context.close(), visitor.close(), adminContext.close()]);
  }, 120_000);
});
