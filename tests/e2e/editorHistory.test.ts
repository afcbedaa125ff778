/**
 * The workbench paths the drawing scenario (`editor.test.ts`) does not walk, in a real Chromium
 * against the real server: the 409 conflict dialog from two pages, version history (read-only
 * view, side-by-side diff, restore), the Structured Text view, the text-form toggle, zoom and fit,
 * PNG export, PLCopen XML import/export on My programs, joining a class with the demo join code,
 * the password reset through the local fake mailbox, and the session-expiry round trip.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { BrowserContext, Page } from 'playwright-core';
import type { Program } from '@shared/ladder/schema';
import { layoutProgram } from '@/editor/layout';
import { DEMO_ADMIN, DEMO_CLASS, DEMO_STUDENTS, type DemoAccount } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';

const suite = useBrowserSuite();
/** The eight bytes every PNG file starts with (PNG specification, ISO/IEC 15948, 5.2). */
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** The demo three-wire start/stop rung (demo data): S1 AND (S2 OR K1) -> K1. */
function startStop(title: string): Program {
  return {
    format: 'rungwright.program',
    version: 1,
    title,
    description: '',
    tags: [
      { name: 'S1', address: '%IX1', comment: 'stop (demo)' },
      { name: 'S2', address: '%IX2', comment: 'start forward (demo)' },
      { name: 'K1', address: '%QX1', comment: 'forward contactor (demo)' },
    ],
    rungs: [
      {
        id: 'r1',
        comment: 'Start/stop with seal-in',
        network: {
          kind: 'series',
          id: 'n1',
          items: [
            { kind: 'contact', id: 'a', variant: 'no', operand: 'S1' },
            { kind: 'parallel', id: 'p', branches: [{ kind: 'contact', id: 'b', variant: 'no', operand: 'S2' }, { kind: 'contact', id: 'c', variant: 'no', operand: 'K1' }] },
            { kind: 'coil', id: 'k', variant: 'coil', operand: 'K1' },
          ],
        },
      },
    ],
  };
}

async function signIn(page: Page, account: DemoAccount, password = account.password): Promise<void> {
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

async function signedInContext(account: DemoAccount): Promise<{ context: BrowserContext; page: Page }> {
  const context = await suite.browser.newContext({ viewport: { width: 1440, height: 900 }, acceptDownloads: true });
  const page = await context.newPage();
  await page.goto(`${suite.server.url}/sign-in`, { waitUntil: 'networkidle' });
  await signIn(page, account);
  await page.waitForURL(/\/programs$/);
  return { context, page };
}

/** Create a program through the API from inside the page (same cookie, same origin). */
async function createProgram(page: Page, document: Program): Promise<string> {
  return page.evaluate(async (doc) => {
    const res = await fetch('/api/programs', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ title: doc.title, document: doc }) });
    if (!res.ok) throw new Error(`create answered ${res.status}: ${await res.text()}`);
    return ((await res.json()) as { program: { id: string } }).program.id;
  }, document);
}

async function head(page: Page, id: string): Promise<{ number: number; document: Program }> {
  return page.evaluate(async (programId) => ((await (await fetch(`/api/programs/${programId}`)).json()) as { head: { number: number; document: Program } }).head, id);
}

async function openWorkbench(page: Page, id: string): Promise<void> {
  await page.goto(`${suite.server.url}/programs/${id}`, { waitUntil: 'networkidle' });
  await page.getByTestId('rung-canvas').waitFor();
  await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version \d+/);
}

/** Add a rung below with one element by keyboard, then save with a message. */
async function addRungAndSave(page: Page, key: string, message: string): Promise<void> {
  await page.getByTestId('rung-canvas').focus();
  await page.keyboard.press('Control+Enter');
  await page.keyboard.press(key);
  await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Unsaved changes/);
  await page.keyboard.press('Control+s');
  await page.getByLabel('Version message').fill(message);
  await page.getByLabel('Version message').press('Enter');
}

/** The canvas pixels as a PNG (the rungs are drawn on it, not in the DOM). */
async function canvasPixels(page: Page): Promise<Buffer> {
  return page.getByTestId('rung-canvas').screenshot();
}

describe('workbench paths in a real browser', () => {
  let context: BrowserContext;
  let page: Page;
  let programId: string;

  beforeAll(async () => {
    ({ context, page } = await signedInContext(DEMO_STUDENTS[1]!));
    programId = await createProgram(page, startStop('Conveyor history (e2e demo)'));
  });
  afterAll(async () => context?.close());

  it('shows the conflict dialog to the second of two pages saving on one base; keep mine and reload theirs both work', async () => {
    const other = await context.newPage();
    await openWorkbench(page, programId);
    await openWorkbench(other, programId);

    await addRungAndSave(page, 'c', 'First page: a contact rung');
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 2/);

    await addRungAndSave(other, 'o', 'Second page: a coil rung');
    const dialog = other.getByRole('alertdialog');
    await dialog.waitFor();
    expect(await dialog.innerText()).toMatch(/Version 2 was saved after you opened this program/);
    await other.screenshot({ path: `${SHOTS}/workbench-conflict.png` });
    await dialog.getByRole('button', { name: 'Keep mine as a new version' }).click();
    await expect.poll(() => other.getByTestId('save-status').innerText()).toMatch(/Saved · version 3/);
    const kept = await head(other, programId);
    expect(kept.number).toBe(3);
    expect(kept.document.rungs.map((r) => r.network.items.map((n) => n.kind))).toEqual([['contact', 'parallel', 'coil'], ['coil']]);

    // The first page is now behind: its next save conflicts, and "reload theirs" brings version 3.
    await addRungAndSave(page, 'c', 'First page again');
    await page.getByRole('alertdialog').waitFor();
    await page.getByRole('alertdialog').getByRole('button', { name: /Reload theirs/ }).click();
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 3/);
    expect((await head(page, programId)).number).toBe(3);
    await page.getByRole('alertdialog').waitFor({ state: 'hidden' });
    await other.close();
  });

  it('opens an old version read-only, compares two versions side by side and restores one', async () => {
    await openWorkbench(page, programId);
    await page.getByRole('button', { name: 'History' }).click();
    const history = page.getByRole('region', { name: 'Version history' });
    await history.getByText('Version 3').waitFor();
    await history.locator('li', { hasText: 'Version 1' }).getByRole('button', { name: 'Open' }).click();
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Version 1 · read-only/);
    // Read-only: the save button is disabled and a key that would edit does nothing.
    expect(await page.getByRole('button', { name: 'Save…' }).isDisabled()).toBe(true);

    await history.getByLabel('Tick version 1 to compare').check();
    await history.getByLabel('Tick version 3 to compare').check();
    await history.getByRole('button', { name: 'Compare the two ticked' }).click();
    const diff = history.getByLabel('Differences');
    await diff.waitFor();
    expect(await diff.locator('th').allInnerTexts()).toEqual(['Version 1', 'Version 3']);
    expect(await diff.locator('tr.same').count()).toBe(1);
    expect(await diff.locator('tr.added').count()).toBe(1);
    expect(await diff.locator('tr.added .tag').textContent()).toBe('added');
    await page.screenshot({ path: `${SHOTS}/workbench-history-diff.png` });

    await history.getByRole('button', { name: 'Back to my working copy' }).click();
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 3/);
    await history.locator('li', { hasText: 'Version 1' }).getByRole('button', { name: 'Restore' }).click();
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 4/);
    const restored = await head(page, programId);
    expect(restored.number).toBe(4);
    expect(restored.document.rungs).toHaveLength(1);
    await page.keyboard.press('Escape');
  });

  it('shows the Structured Text, toggles the text form, zooms, fits and exports a PNG', async () => {
    await openWorkbench(page, programId);
    const canvas = page.getByTestId('rung-canvas');

    await page.getByRole('button', { name: /^Structured Text view/ }).click();
    const st = page.getByLabel('Structured Text of the program');
    await st.waitFor();
    expect(await st.innerText()).toContain('K1 := (S1 AND (S2 OR K1));');
    await page.screenshot({ path: `${SHOTS}/workbench-structured-text.png` });
    await page.keyboard.press('Escape');
    await st.waitFor({ state: 'detached' });

    const before = await canvasPixels(page);
    const toggle = page.getByRole('button', { name: /^Show text form of rungs/ });
    await toggle.click();
    expect(await toggle.getAttribute('aria-pressed')).toBe('true');
    await expect.poll(async () => (await canvasPixels(page)).equals(before)).toBe(false);
    await page.screenshot({ path: `${SHOTS}/workbench-text-form.png` });
    await toggle.click();
    expect(await toggle.getAttribute('aria-pressed')).toBe('false');

    expect(await canvas.getAttribute('data-zoom')).toBe('1');
    await page.getByRole('button', { name: /^Zoom in/ }).click();
    expect(await canvas.getAttribute('data-zoom')).toBe('1.2');
    await page.getByRole('button', { name: /^Zoom out/ }).click();
    await page.getByRole('button', { name: /^Zoom out/ }).click();
    // Zoom 1 is the smallest: canvas text stays at 11 px or more, and a wide program scrolls instead.
    expect(await canvas.getAttribute('data-zoom')).toBe('1');
    // Fit makes the rungs as wide as the canvas (rounded down to hundredths), between 1 and 1.5.
    await page.getByRole('button', { name: /^Zoom in/ }).click();
    await page.getByRole('button', { name: /^Fit to view/ }).click();
    const columnWidth = await canvas.evaluate((el) => el.clientWidth);
    const drawingWidth = layoutProgram(startStop('')).width;
    expect(Number(await canvas.getAttribute('data-zoom'))).toBe(Math.min(1.5, Math.max(1, Math.floor((columnWidth / drawingWidth) * 100) / 100)));
    await page.screenshot({ path: `${SHOTS}/workbench-fitted.png` });

    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: /^Export as PNG/ }).click();
    const file = await download;
    expect(file.suggestedFilename()).toBe('Conveyor history (e2e demo).png');
    const bytes = readFileSync((await file.path())!);
    expect([...bytes.subarray(0, 8)]).toEqual(PNG_SIGNATURE);
    expect(bytes.length).toBeGreaterThan(1000);
  });

  it('draws the workbench in the dark theme with the rungs on a dark paper', async () => {
    const dark = await context.newPage();
    await dark.emulateMedia({ colorScheme: 'dark' });
    await dark.goto(`${suite.server.url}/programs`, { waitUntil: 'networkidle' });
    await dark.evaluate(() => localStorage.removeItem('rungwright.colorScheme'));
    await openWorkbench(dark, programId);
    await dark.getByRole('button', { name: /^Show text form of rungs/ }).click();
    await dark.getByRole('button', { name: 'History' }).click();
    await dark.getByRole('region', { name: 'Version history' }).getByText('Version 1', { exact: true }).waitFor();
    await dark.screenshot({ path: `${SHOTS}/workbench-dark-history.png` });
    await dark.keyboard.press('Escape');
    await dark.screenshot({ path: `${SHOTS}/workbench-dark.png` });
    // The canvas paper is dark: its mean brightness over a corner with no rung is low.
    const paper = await dark.getByTestId('rung-canvas').evaluate((el) => getComputedStyle(el).backgroundColor);
    const [r, g, b] = (paper.match(/\d+/g) ?? []).map(Number);
    expect((r! + g! + b!) / 3).toBeLessThan(80);
    await dark.close();
  });

  it('exports a program as PLCopen XML on My programs and imports the file back', async () => {
    await page.goto(`${suite.server.url}/programs`, { waitUntil: 'networkidle' });
    const exported = await head(page, programId);
    const row = page.locator('tr', { hasText: 'Conveyor history (e2e demo)' });
    expect(await row.locator('td').nth(3).innerText()).toBe(String(exported.number));
    const download = page.waitForEvent('download');
    await row.getByRole('button', { name: 'Export PLCopen XML' }).click();
    const file = await download;
    expect(file.suggestedFilename()).toBe('Conveyor history (e2e demo).xml');
    const xml = readFileSync((await file.path())!, 'utf8');
    expect(xml).toMatch(/^<\?xml/);
    expect(xml).toContain('<project');

    const renamed = xml.replaceAll('Conveyor history (e2e demo)', 'Imported conveyor (e2e demo)');
    await page.setInputFiles('input[aria-label="Program file to import"]', { name: 'conveyor.xml', mimeType: 'application/xml', buffer: Buffer.from(renamed) });
    await page.locator('tr', { hasText: 'Imported conveyor (e2e demo)' }).waitFor();
    await page.screenshot({ path: `${SHOTS}/programs-imported.png` });
    const programs = await page.evaluate(async () => ((await (await fetch('/api/programs')).json()) as { programs: { id: string; title: string }[] }).programs);
    const imported = programs.find((p) => p.title === 'Imported conveyor (e2e demo)');
    expect(imported).toBeDefined();
    const importedHead = await head(page, imported!.id);
    expect(importedHead.document.rungs.map((r) => r.comment)).toEqual(exported.document.rungs.map((r) => r.comment));
    expect(importedHead.document.rungs.map((r) => r.network.items.map((n) => n.kind))).toEqual(exported.document.rungs.map((r) => r.network.items.map((n) => n.kind)));
    expect(importedHead.document.tags.map((t) => t.name)).toEqual(['S1', 'S2', 'K1']);

    // A file that is not PLCopen XML gets a clear message, not a crash.
    await page.setInputFiles('input[aria-label="Program file to import"]', { name: 'notes.xml', mimeType: 'application/xml', buffer: Buffer.from('<notes>hello</notes>') });
    await expect.poll(() => page.locator('.n-message').allInnerTexts()).toEqual(expect.arrayContaining([expect.stringMatching(/PLCopen|project/i)]));
  });
});

describe('accounts in a real browser', () => {
  const newStudent = { email: 'sam.okafor@larch-hollow.example', name: 'Sam Okafor (demo student)', password: 'demo-first-password' };

  it('signs up with the demo join code, finishes from the mailed link, then resets the password through the local mailbox', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    await page.goto(`${suite.server.url}/join`, { waitUntil: 'networkidle' });
    await page.getByLabel('Join code').fill(DEMO_CLASS.joinCode);
    await page.getByLabel('Your name').fill(newStudent.name);
    await page.getByLabel('E-mail').fill(newStudent.email);
    await page.getByRole('button', { name: 'E-mail me the link' }).click();
    await page.getByTestId('sign-up-sent').waitFor();

    // The mailbox, read as the demo admin: the mail to the new student with this subject, once it has arrived.
    const admin = await signedInContext(DEMO_ADMIN);
    const mailAbout = async (subject: string) => {
      const mail = await admin.page.evaluate(async () => ((await (await fetch('/api/dev/mail')).json()) as { mail: { to: string; subject: string; text: string }[] }).mail);
      return mail.find((m) => m.to.includes(newStudent.email) && m.subject === subject);
    };
    await expect.poll(() => mailAbout('Finish creating your Rungwright account'), { timeout: 10_000 }).toBeTruthy();
    const finish = (await mailAbout('Finish creating your Rungwright account'))!.text.match(/https?:\/\/\S+\/join\/finish#token=[\w-]+/)?.[0];
    expect(finish).toBeDefined();
    await page.goto(finish!, { waitUntil: 'networkidle' });
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create my account' }).click();
    await page.getByText(/at least 10/).first().waitFor();
    await page.screenshot({ path: `${SHOTS}/join-class-error.png` });
    await page.getByLabel('Password').fill(newStudent.password);
    await page.getByRole('button', { name: 'Create my account' }).click();
    await page.waitForURL(/\/classes\/[^/]+\/labs$/);
    await context.clearCookies();

    await page.goto(`${suite.server.url}/reset-password`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail').fill(newStudent.email);
    await page.getByRole('button', { name: 'Send me a reset link' }).click();
    await page.locator('.n-alert').first().waitFor();

    await expect.poll(() => mailAbout('Reset your Rungwright password'), { timeout: 10_000 }).toBeTruthy();
    const reset = await mailAbout('Reset your Rungwright password');
    await admin.context.close();
    const link = reset!.text.match(/https?:\/\/\S+\/reset-password#token=[\w-]+/)?.[0];
    expect(link).toBeDefined();

    await page.goto(link!, { waitUntil: 'networkidle' });
    await page.getByLabel('New password').fill('demo-second-password');
    await page.getByRole('button', { name: 'Set new password' }).click();
    await page.getByText('Your password is changed.').waitFor();
    await page.screenshot({ path: `${SHOTS}/reset-password-done.png` });

    await page.goto(`${suite.server.url}/sign-in`, { waitUntil: 'networkidle' });
    await signIn(page, { ...DEMO_STUDENTS[0]!, email: newStudent.email }, newStudent.password);
    await page.getByRole('alert').first().waitFor();
    await signIn(page, { ...DEMO_STUDENTS[0]!, email: newStudent.email }, 'demo-second-password');
    await page.waitForURL(/\/programs$/);
    await context.close();
  });

  it('sends an expired session to sign-in with ?next= and back to the same program after signing in', async () => {
    const { context, page } = await signedInContext(DEMO_STUDENTS[2]!);
    const id = await createProgram(page, startStop('Session expiry (e2e demo)'));
    await openWorkbench(page, id);
    await context.clearCookies();
    await page.getByRole('button', { name: 'History' }).click();
    await page.waitForURL(/\/sign-in\?next=/);
    expect(decodeURIComponent(new URL(page.url()).searchParams.get('next') ?? '')).toBe(`/programs/${id}`);
    await page.screenshot({ path: `${SHOTS}/session-expired.png` });
    await signIn(page, DEMO_STUDENTS[2]!);
    await page.waitForURL(new RegExp(`/programs/${id}$`));
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 1/);
    await context.close();
  });
});
