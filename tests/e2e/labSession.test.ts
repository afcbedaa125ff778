/**
 * A student's lab session from start to finish, in real Chromium, each journey in a fresh browser
 * context: the demo three-wire lab drawn with the mouse only (branch included), left and come back
 * to (the draft restored), self-checked, saved and submitted, its report read for that version;
 * and the keys going to the area that has the focus (T on the rungs inserts a TON, T on the panel
 * trips F1). Screenshots at 1280×800 and 1920×1080 in `tests/e2e/screenshots/`.
 */
import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { NetworkNode, Program } from '@shared/ladder/schema';
import { THREE_WIRE } from '@shared/labs';
import { layoutProgram } from '@/editor/layout';
import { DEMO_CLASS, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();

/** Everything that went wrong on a page: uncaught errors and refused API calls (a 401 at sign-in aside). */
function watchProblems(page: Page, problems: string[]): void {
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('response', async (response) => {
    const url = response.url();
    if (url.includes('/api/') && response.status() >= 400 && !url.endsWith('/api/me')) problems.push(`${response.request().method()} ${url} ${response.status()} ${await response.text().catch(() => '')}`);
  });
}

async function openThreeWireLab(page: Page): Promise<string> {
  await page.goto(`${suite.server.url}/classes`, { waitUntil: 'networkidle' });
  await page.getByRole('link', { name: DEMO_CLASS.name }).click();
  await page.waitForURL(/\/classes\/[^/]+\/labs$/);
  await page.getByRole('link', { name: THREE_WIRE.title }).click();
  await page.waitForURL(/\/labs\/[^/]+$/);
  await page.getByTestId('rung-canvas').waitFor();
  await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version \d+/);
  return page.url();
}

// Documents of the same shape as the one on screen: the test finds elements and slots with the
// same layout function the canvas uses, then scales by the canvas's zoom (the lab fits its rungs to the column).
const contact = (id: string, operand: string, variant: 'no' | 'nc' = 'no'): NetworkNode => ({ kind: 'contact', id, variant, operand });
const starterRung = THREE_WIRE.starter.rungs[0]!;
const startButton = starterRung.network.items[0]!;
const coilK1 = starterRung.network.items[1]!;
function rungOne(items: NetworkNode[]): Program {
  return { ...THREE_WIRE.starter, rungs: [{ ...starterRung, network: { kind: 'series', id: 's', items } }] };
}
const branched = (second: NetworkNode[]): NetworkNode => ({
  kind: 'parallel',
  id: 'p',
  branches: [startButton, { kind: 'series', id: 'b', items: second }],
});

async function zoomOf(page: Page): Promise<number> {
  return Number(await page.getByTestId('rung-canvas').getAttribute('data-zoom'));
}

async function toScreen(page: Page, point: { x: number; y: number }) {
  const box = (await page.getByTestId('rung-canvas').boundingBox())!;
  const zoom = await zoomOf(page);
  return { x: box.x + point.x * zoom, y: box.y + point.y * zoom };
}

function elementPoint(doc: Program, id: string) {
  for (const rung of layoutProgram(doc).rungs) {
    const box = rung.elements.find((b) => b.id === id);
    if (box) return { x: box.x + box.width / 2, y: rung.top + box.wireY };
  }
  throw new Error(`no element ${id}`);
}

function slotPoint(doc: Program, path: number[], index: number) {
  const rung = layoutProgram(doc).rungs[0]!;
  const slot = rung.slots.find((s) => s.target.index === index && s.target.path.join('.') === path.join('.'));
  if (!slot) throw new Error(`no slot ${path.join('.')}/${index}`);
  return { x: slot.x, y: rung.top + slot.y };
}

/** Pick an operand by the mouse: open the field's list and click the suggestion that starts with `name — `. */
async function pickOperand(page: Page, name: string) {
  await page.getByLabel('Operand', { exact: true }).click();
  await page.locator('.n-base-select-option', { hasText: `${name} — ` }).first().click();
  await expect.poll(() => page.getByLabel('Operand', { exact: true }).inputValue()).toBe(name);
}

async function clickPalette(page: Page, item: string) {
  await page.locator(`[data-palette="${item}"]`).click();
}

async function clickTool(page: Page, name: RegExp) {
  await page.getByRole('button', { name }).click();
}

/** The three-wire rung and the two lamp rungs, drawn with the mouse only. */
async function drawThreeWireByMouse(page: Page, shot: (name: string) => Promise<void>) {
  // Select the start button, draw a branch below it, and put the seal-in contact in the branch.
  const start = elementPoint(rungOne([startButton, coilK1]), startButton.id);
  const at = await toScreen(page, start);
  await page.mouse.click(at.x, at.y);
  await clickTool(page, /^Add branch below/);
  await clickPalette(page, 'contact:no');
  await pickOperand(page, 'K1_Aux');
  await shot('branch');
  // The stop button in series ahead of the branch: dragged from the palette to the rung's first slot.
  const sealed = rungOne([branched([contact('c', 'K1_Aux')]), coilK1]);
  const target = slotPoint(sealed, [], 0);
  const zoom = await zoomOf(page);
  await page.dragAndDrop('[data-palette="contact:no"]', '[data-testid="rung-canvas"]', { targetPosition: { x: target.x * zoom, y: target.y * zoom } });
  await pickOperand(page, 'Stop_PB');
  // Green lamp while K1 is closed, red lamp while it is open: new rungs, filled from the palette.
  for (const [variant, lamp] of [['no', 'Green_Lamp'], ['nc', 'Red_Lamp']] as const) {
    await clickTool(page, /^Add rung below/);
    await clickPalette(page, `contact:${variant}`);
    await pickOperand(page, 'K1_Aux');
    await clickPalette(page, 'coil:coil');
    await pickOperand(page, lamp);
  }
}

const VIEWPORTS = [
  { name: '1280x800', viewport: { width: 1280, height: 800 }, student: DEMO_STUDENTS[0]! },
  { name: '1920x1080', viewport: { width: 1920, height: 1080 }, student: DEMO_STUDENTS[1]! },
] as const;

describe('a student\'s lab session', () => {
  for (const run of VIEWPORTS) {
    it(`draws the three-wire rung by mouse, leaves and restores the draft, self-checks, saves and submits what was checked (${run.name})`, async () => {
      const problems: string[] = [];
      const context: BrowserContext = await suite.browser.newContext({ viewport: run.viewport });
      const page = await signInThroughPage(context, suite.server.url, run.student);
      watchProblems(page, problems);
      const shot = async (name: string) => {
        await page.screenshot({ path: `${SHOTS}/lab-session-${run.name}-${name}.png` });
      };

      const labUrl = await openThreeWireLab(page);
      // The first-steps guide greets a student once; dismissed, it stays away for them.
      await page.getByTestId('first-steps').waitFor();
      await page.getByTestId('sim-status').waitFor();
      await shot('1-opened');
      await page.getByRole('button', { name: 'Got it' }).click();
      expect(await page.getByTestId('first-steps').count()).toBe(0);
      // The starter compiles: one current status line, and the panel with its I/O table is there.
      expect(await page.getByTestId('sim-status').innerText()).toMatch(/The program compiles/);

      await drawThreeWireByMouse(page, async (name) => shot(`2-${name}`));
      await expect.poll(() => page.getByRole('region', { name: 'Messages' }).innerText()).toMatch(/No problems found/);
      await expect.poll(() => page.getByTestId('sim-status').innerText()).toMatch(/The program compiles/);
      expect(await page.getByTestId('save-status').innerText()).toMatch(/Unsaved changes/);
      // A draft is kept on the server a few seconds after the last edit.
      await expect.poll(() => page.getByTestId('draft-status').innerText(), { timeout: 10_000 }).toMatch(/draft kept \d/);
      await shot('3-drawn');

      // Leaving asks; the changes stay as a draft.
      await page.getByTestId('back-link').click();
      await page.getByTestId('leave-dialog').waitFor();
      await shot('4-leave-dialog');
      await page.getByRole('button', { name: 'Leave, keep the draft' }).click();
      await page.waitForURL(/\/classes\/[^/]+\/labs$/);

      // Coming back offers the draft: restored, the three rungs are on screen again, unsaved.
      await page.getByRole('link', { name: THREE_WIRE.title }).click();
      await page.waitForURL(labUrl);
      await page.getByTestId('draft-offer').waitFor();
      expect(await page.getByTestId('draft-offer').innerText()).toMatch(/You have unsaved changes from \d{1,2}:\d{2}/);
      await shot('5-draft-offer');
      await page.getByRole('button', { name: 'Restore' }).click();
      await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Unsaved changes/);
      await expect.poll(() => page.getByRole('region', { name: 'Messages' }).innerText()).toMatch(/No problems found/);

      // Self-check runs the visible checks on what is on screen.
      await page.getByRole('button', { name: 'Self-check', exact: true }).click();
      await expect.poll(() => page.getByTestId('grade-report').getByTestId('report-score').innerText()).toBe('7 / 7');
      const selfVisible = await page.getByTestId('grade-report').getByTestId('visible-score').innerText();
      expect(selfVisible).toMatch(/Visible checks: 7 \/ 7 points/);
      await shot('6-self-check');

      // Save and submit: what is on screen becomes version 2, and version 2 is what is submitted.
      await page.getByRole('button', { name: 'Save and submit…' }).click();
      await expect.poll(() => page.getByTestId('submit-confirm').innerText()).toMatch(/saved as version 2/);
      expect(await page.getByTestId('submit-self-check').innerText()).toMatch(/7 \/ 7 visible points/);
      await shot('7-submit-dialog');
      await page.getByTestId('submit-button').click();
      await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 2/);
      await expect.poll(() => page.getByTestId('submission-status').innerText(), { timeout: 30_000 }).toMatch(/Version 2[\s\S]*graded/);
      // The report names the version and shows the visible score the self-check of the same document showed.
      const report = page.getByRole('region', { name: 'Check results of version 2' });
      await expect.poll(() => report.getByTestId('visible-score').innerText()).toMatch(/Visible checks: 7 \/ 7 points/);
      expect((await report.getByTestId('visible-score').innerText()).match(/\d+ \/ \d+/)?.[0]).toBe(selfVisible.match(/\d+ \/ \d+/)?.[0]);
      await expect.poll(() => page.getByTestId('submission-score').innerText()).toMatch(/Score: 13 \/ 13/);
      await expect.poll(() => report.getByTestId('hidden-summary').innerText()).toMatch(/Hidden checks: 4 passed, 0 failed/);
      await shot('8-report');

      // The draft went with the save: opening the lab again offers nothing.
      const draft = await page.evaluate(async () => {
        const programs = (await (await fetch('/api/programs')).json()) as { programs: { id: string; labTitle: string | null }[] };
        const mine = programs.programs.find((p) => p.labTitle !== null && p.labTitle.startsWith('Three-wire'));
        return mine ? ((await (await fetch(`/api/programs/${mine.id}/draft`)).json()) as { draft: unknown }).draft : 'no program';
      });
      expect(draft).toBeNull();

      // Signing out, then reloading: the sign-in page, no question about unsaved work.
      let dialogs = 0;
      page.on('dialog', (d) => {
        dialogs += 1;
        void d.dismiss();
      });
      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL(/\/sign-in/);
      await page.reload({ waitUntil: 'networkidle' });
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      expect(dialogs).toBe(0);
      await shot('9-signed-out');

      expect(problems).toEqual([]);
      await context.close();
    }, 240_000);
  }

  it('sends each key to the area that has the focus: T on the rungs is a TON, T on the panel trips F1', async () => {
    const problems: string[] = [];
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[2]!);
    watchProblems(page, problems);
    await openThreeWireLab(page);
    await page.getByRole('button', { name: 'Got it' }).click();
    const f1 = () => page.locator('[data-device="F1"] .flag').innerText();
    const messages = () => page.getByRole('region', { name: 'Messages' }).innerText();
    await page.getByTestId('field-panel').waitFor();
    expect(await f1()).toBe('ok');

    // The canvas has the focus: T is the editor's (a TON goes into the program), the panel is untouched.
    const start = await toScreen(page, elementPoint(rungOne([startButton, coilK1]), startButton.id));
    await page.mouse.click(start.x, start.y);
    await page.keyboard.press('t');
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Unsaved changes/);
    expect(await f1()).toBe('ok');
    await page.screenshot({ path: `${SHOTS}/keys-canvas-t.png` });
    await page.keyboard.press('Control+z');
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 1/);
    const before = await messages();

    // Inserting the TON turned the dock to the inspector; back on the panel, with the focus in it,
    // T trips F1 and the program is what it was.
    await page.getByRole('tab', { name: 'Panel' }).click();
    await page.getByTestId('field-panel').focus();
    await page.keyboard.press('t');
    await expect.poll(f1).toBe('TRIPPED');
    expect(await page.getByTestId('save-status').innerText()).toMatch(/Saved · version 1/);
    expect(await messages()).toBe(before);
    await page.keyboard.press('r');
    await page.screenshot({ path: `${SHOTS}/keys-panel-t.png` });

    // The keyboard sheet lists every key by the area it belongs to.
    await page.getByTestId('rung-canvas').focus();
    await page.keyboard.press('?');
    const sheet = page.getByTestId('keyboard-sheet');
    await sheet.waitFor();
    expect(await sheet.locator('[data-area="editor"]').innerText()).toMatch(/Insert TON\s*$|T\s+Insert TON/m);
    expect(await sheet.locator('[data-area="panel"]').innerText()).toMatch(/T\s+F1 Motor overload: trip test/);
    expect(await sheet.locator('[data-area="page"]').innerText()).toMatch(/Save a version/);
    await page.screenshot({ path: `${SHOTS}/keys-sheet.png` });
    await page.keyboard.press('Escape');
    await sheet.waitFor({ state: 'hidden' });

    // Reloading with unsaved changes: the browser asks first, and the draft is offered after the reload.
    const dialogs: string[] = [];
    page.on('dialog', (d) => {
      dialogs.push(d.type());
      void d.accept();
    });
    // A click that waits until nothing lies over the rungs (the sheet's mask fades out after Escape).
    const canvasBox = (await page.getByTestId('rung-canvas').boundingBox())!;
    await page.getByTestId('rung-canvas').click({ position: { x: start.x - canvasBox.x, y: start.y - canvasBox.y } });
    await page.keyboard.press('t');
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Unsaved changes/);
    await expect.poll(() => page.getByTestId('draft-status').innerText(), { timeout: 10_000 }).toMatch(/draft kept/);
    await page.reload({ waitUntil: 'networkidle' });
    expect(dialogs).toEqual(['beforeunload']);
    await page.getByTestId('draft-offer').waitFor();
    await page.getByRole('button', { name: 'Discard' }).click();
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 1/);
    // Discarded, it is gone: a second reload offers nothing and asks nothing.
    await page.reload({ waitUntil: 'networkidle' });
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 1/);
    expect(await page.getByTestId('draft-offer').count()).toBe(0);
    expect(dialogs).toEqual(['beforeunload']);

    expect(problems).toEqual([]);
    await context.close();
  }, 120_000);
});
