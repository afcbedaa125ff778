/**
 * Rosters and invitations in a real browser: the demo instructor uploads a roster to the demo
 * class, the invited person accepts from the e-mailed link and lands in the class, the instructor
 * removes them again; the admin invites an instructor; an existing account is invited by hand and
 * joins only signed in as itself, and an admin's address is invited like any other and refused at
 * acceptance. Mail is read from the local fake mailbox.
 */
import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { SentMailEntry } from '@shared/api/mail';
import { DEMO_ADMIN, DEMO_CLASS, DEMO_INSTRUCTOR, DEMO_STUDENTS, type DemoAccount } from '../../server/db/demoAccounts';
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

    // ── Upload: one new address, one bad row; the report shows its three groups. ──
    await teacher.setInputFiles('input[aria-label="Roster CSV file"]', { name: 'motor-control-roster.csv', mimeType: 'text/csv', buffer: Buffer.from(ROSTER_CSV) });
    await teacher.getByTestId('roster-report').waitFor();
    expect(await teacher.getByTestId('roster-invited').innerText()).toMatch(/^Invited 1[\s\S]*line 2[\s\S]*Lee Moss · lee\.moss@larch-hollow\.example/);
    expect(await teacher.getByTestId('roster-rejected').innerText()).toMatch(/^Rejected 1[\s\S]*line 3[\s\S]*not-an-address[\s\S]*not a valid e-mail address/);
    expect(await teacher.getByTestId('roster-already').innerText()).toMatch(/^Already in 0/);
    await expect.poll(() => teacher.getByTestId('roster-invitations').innerText()).toMatch(/lee\.moss@larch-hollow\.example[\s\S]*Lee Moss/);
    await teacher.getByTestId('roster-report').scrollIntoViewIfNeeded();
    await shootBoth(teacher, 'roster-uploaded');

    // ── The invitation mail arrived; its link opens the accept page. ──
    const admin = await signIn(adminContext, DEMO_ADMIN);
    watch(admin, 'admin', problems, [/instructor-invitations 409/]);
    await expect.poll(async () => (await mailTo(admin, NEWCOMER.email)).length, { timeout: 10_000 }).toBe(1);
    const firstLink = invitationLink((await mailTo(admin, NEWCOMER.email))[0]!);

    // ── The instructor sends it again from the roster: a new link, and the first one stops working. ──
    await teacher.getByRole('button', { name: `Send the invitation to ${NEWCOMER.email} again` }).click();
    await teacher.getByText(`A new invitation link is on its way to ${NEWCOMER.email}`).waitFor();
    await expect.poll(async () => (await mailTo(admin, NEWCOMER.email)).length, { timeout: 10_000 }).toBe(2);
    const newest = (await mailTo(admin, NEWCOMER.email)).sort((a, b) => b.receivedAt.localeCompare(a.receivedAt))[0]!;
    expect(newest.subject).toBe(`You are invited to ${DEMO_CLASS.name}`);
    const link = invitationLink(newest);
    expect(link).not.toBe(firstLink);
    const stale = await admin.evaluate(async (token) => (await fetch('/api/auth/invitations/lookup', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ token }) })).status, firstLink.split('#token=')[1]!);
    expect(stale).toBe(400);
    expect(await teacher.getByTestId('roster-invitations').innerText()).toMatch(/lee\.moss@larch-hollow\.example[\s\S]*works until/);

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
  it('names a roster without its header line', async () => {
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

    expect(problems).toEqual([]);
    await context.close();
  }, 120_000);

  it('invites an existing account by hand, which joins signed in as itself; an admin address is invited like any other and refused at acceptance', async () => {
    const problems: string[] = [];
    const teacherContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const adminContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const priyaContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const darkContext = await suite.browser.newContext({ viewport: VIEWPORT, colorScheme: 'dark' });
    const [ana, , priya] = DEMO_STUDENTS as [DemoAccount, DemoAccount, DemoAccount];
    const priyaName = priya.name;

    // ── Priya (a demo student) has left the class; the instructor invites her back by hand. ──
    const teacher = await signIn(teacherContext, DEMO_INSTRUCTOR);
    watch(teacher, 'instructor', problems);
    await teacher.goto(`${suite.server.url}/classes`, { waitUntil: 'networkidle' });
    await teacher.getByRole('row', { name: DEMO_CLASS.name }).getByRole('link', { name: /students: open the roster$/ }).click();
    await teacher.waitForURL(/\/classes\/[^/]+\/students$/);
    const classId = teacher.url().split('/').slice(-2)[0]!;
    const left = await teacher.evaluate(
      async ({ classId, email }) => {
        const { students } = (await (await fetch(`/api/classes/${classId}/students`)).json()) as { students: { id: string; email: string }[] };
        const priya = students.find((s) => s.email === email)!;
        return (await fetch(`/api/classes/${classId}/students/${priya.id}`, { method: 'DELETE' })).status;
      },
      { classId, email: priya.email },
    );
    expect(left).toBe(204);
    await teacher.reload({ waitUntil: 'networkidle' });
    await expect.poll(() => teacher.getByTestId('roster-students').innerText()).not.toMatch(/Priya Nair/);

    await teacher.getByLabel('Student e-mail').fill('not an address');
    await teacher.getByRole('button', { name: 'Send invitation' }).click();
    await teacher.getByText('not a valid e-mail address').waitFor();
    await teacher.getByLabel('Student e-mail').fill(priya.email);
    await teacher.getByLabel('Student name').fill('Priya Nair');
    await teacher.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => teacher.getByTestId('roster-invitation-sent').innerText()).toMatch(/^Invitation sent to priya\.nair@larch-hollow\.example\. The link expires /);
    await teacher.getByTestId('roster-invitation-sent').scrollIntoViewIfNeeded();
    await shootBoth(teacher, 'roster-invite-one');
    expect(await teacher.getByTestId('roster-students').innerText()).not.toMatch(/Priya Nair/);

    // ── A roster with the admin's address and a new one: both reported alike, as invited. ──
    const csv = `email,name\n${DEMO_ADMIN.email},Dana Okafor\nsky.lund@larch-hollow.example,Sky Lund\n`;
    await teacher.setInputFiles('input[aria-label="Roster CSV file"]', { name: 'more.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await teacher.getByTestId('roster-report').waitFor();
    expect(await teacher.getByTestId('roster-invited').innerText()).toMatch(
      /^Invited 2[\s\S]*line 2[\s\S]*Dana Okafor · admin@larch-hollow\.example[\s\S]*line 3[\s\S]*Sky Lund · sky\.lund@larch-hollow\.example/,
    );
    expect(await teacher.getByTestId('roster-report').innerText()).not.toMatch(/admin account|instructor account|has an account/i);

    // ── Priya's mail says the address has an account. ──
    const admin = await signIn(adminContext, DEMO_ADMIN);
    watch(admin, 'admin', problems);
    const invitationTo = async (address: string) => (await mailTo(admin, address)).find((m) => m.subject === `You are invited to ${DEMO_CLASS.name}`);
    await expect.poll(() => invitationTo(priya.email), { timeout: 10_000 }).toBeTruthy();
    const priyaMail = (await invitationTo(priya.email))!;
    expect(priyaMail.text).toMatch(/has a Rungwright account already/);
    const link = invitationLink(priyaMail);

    // ── Signed in as someone else (Ana): the page says so and offers to sign out. ──
    const page = await signIn(priyaContext, ana);
    watch(page, 'priya', problems);
    await page.goto(link, { waitUntil: 'networkidle' });
    await page.getByTestId('invitation-someone-else').waitFor();
    expect(await page.getByTestId('invitation-someone-else').innerText()).toContain(`signed in as ${ana.email}, and this invitation is for ${priya.email}.`);
    await shoot(page, 'accept-invitation-someone-else-light.png');
    await page.getByRole('button', { name: 'Sign out' }).click();

    // ── Signed out: sign in first, and the page comes back with the invitation (never in the address). ──
    await page.getByTestId('invitation-sign-in').waitFor();
    await shoot(page, 'accept-invitation-sign-in-light.png');
    await page.getByRole('button', { name: 'Sign in to join' }).click();
    await page.waitForURL(/\/sign-in\?next=(%2F|\/)accept-invitation$/);
    await page.getByLabel('E-mail').fill(priya.email);
    await page.getByLabel('Password').fill(priya.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/accept-invitation$/);
    await page.getByTestId('invitation-join').waitFor();
    await shoot(page, 'accept-invitation-join-light.png');
    const dark = await darkContext.newPage();
    watch(dark, 'signed out (dark)', problems, [/^GET \/api\/me 401/]);
    await dark.goto(link, { waitUntil: 'networkidle' });
    await dark.getByTestId('invitation-sign-in').waitFor();
    await shoot(dark, 'accept-invitation-sign-in-dark.png');

    // Not in the class until the button.
    expect(await page.evaluate(async () => ((await (await fetch('/api/classes')).json()) as { classes: unknown[] }).classes.length)).toBe(0);
    await page.getByRole('button', { name: `Join ${DEMO_CLASS.name}` }).click();
    await page.waitForURL(new RegExp(`/classes/${classId}/labs$`));
    await expect.poll(() => page.locator('h1').innerText()).toContain(DEMO_CLASS.name);

    // ── The admin opens the invitation to their own address: only student accounts join. ──
    await admin.goto(invitationLink((await invitationTo(DEMO_ADMIN.email))!), { waitUntil: 'networkidle' });
    await admin.getByTestId('invitation-not-a-student').waitFor();
    expect(await admin.getByTestId('invitation-not-a-student').innerText()).toMatch(/^Only student accounts join a class as students, and admin@larch-hollow\.example is an admin account/);
    await shoot(admin, 'accept-invitation-not-a-student-light.png');

    // ── The instructor sees Priya back in the class, and the admin not in it. ──
    await teacher.reload({ waitUntil: 'networkidle' });
    await expect.poll(() => teacher.getByTestId('roster-students').innerText()).toMatch(new RegExp(priyaName.replace(/[()]/g, '\\$&')));
    expect(await teacher.getByTestId('roster-students').innerText()).not.toMatch(/Dana Okafor/);

    expect(problems).toEqual([]);
    await Promise.all([teacherContext.close(), adminContext.close(), priyaContext.close(), darkContext.close()]);
  }, 180_000);
});
