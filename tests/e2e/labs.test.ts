import { describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { NetworkNode, Program } from '@shared/ladder/schema';
import { THREE_WIRE } from '@shared/labs';
import type { SentMailEntry } from '@shared/api/mail';
import { layoutProgram } from '@/editor/layout';
import { DEMO_ADMIN, DEMO_CLASS, DEMO_INSTRUCTOR, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
// Wide enough for the brief, the whole default rung width (about 800 px at zoom 1) and the panel side by side.
const VIEWPORT = { width: 1800, height: 1000 };
const failedCalls: string[] = [];
/** A valid 1 × 1 PNG (8-byte signature, IHDR, IDAT, IEND). */
const TINY_PNG = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==';

async function signIn(context: BrowserContext, account: { email: string; password: string }): Promise<Page> {
  const page = await signInThroughPage(context, suite.server.url, account);
  // Any refused API call is a finding of this test: keep the route and the server's message.
  page.on('response', async (response) => {
    if (response.url().includes('/api/') && response.status() >= 400) failedCalls.push(`${response.request().method()} ${response.url()} ${response.status()} ${await response.text().catch(() => '')}`);
  });
  return page;
}

/** Pick an option of a naive-ui select by its visible text. */
async function pick(page: Page, selectLabel: string, option: RegExp | string) {
  await page.locator(`[aria-label="${selectLabel}"]`).click();
  await page.locator('.n-base-select-option', { hasText: option }).first().click();
}

/** The starter's first rung with its start button in a parallel branch (the shape the canvas lays out). */
const contact = (id: string, operand: string): NetworkNode => ({ kind: 'contact', id, variant: 'no', operand });
function withBranch(branches: NetworkNode[][]): Program {
  const first = THREE_WIRE.starter.rungs[0]!;
  const coil = first.network.items[1]!;
  const parallel: NetworkNode = { kind: 'parallel', id: 'p', branches: branches.map((items, i) => ({ kind: 'series', id: `b${i}`, items })) };
  return { ...THREE_WIRE.starter, rungs: [{ ...first, network: { kind: 'series', id: 's', items: [parallel, coil] } }] };
}

function slotPoint(doc: Program, path: number[], index: number) {
  const rung = layoutProgram(doc).rungs[0]!;
  const slot = rung.slots.find((s) => s.target.index === index && s.target.path.join('.') === path.join('.'));
  if (!slot) throw new Error(`no slot ${path.join('.')}/${index}`);
  return { x: slot.x, y: rung.top + slot.y };
}

function elementPoint(doc: Program, id: string) {
  for (const rung of layoutProgram(doc).rungs) {
    const box = rung.elements.find((b) => b.id === id);
    if (box) return { x: box.x + box.width / 2, y: rung.top + box.wireY };
  }
  throw new Error(`no element ${id}`);
}

async function setOperand(page: Page, value: string) {
  const field = page.getByLabel('Operand', { exact: true });
  await field.fill(value);
  await field.press('Enter');
}

/** A rung `contact -> coil` typed with the editor's keys (new rung, contact, operand, coil, operand). */
async function typeRung(page: Page, contactKey: string, operand: string, coilOperand: string) {
  await page.getByTestId('rung-canvas').focus();
  await page.keyboard.press('Control+Enter');
  await page.keyboard.press(contactKey);
  await page.keyboard.press('Enter');
  await page.keyboard.type(operand);
  await page.keyboard.press('Enter');
  await page.keyboard.press('o');
  await page.keyboard.press('Enter');
  await page.keyboard.type(coilOperand);
  await page.keyboard.press('Enter');
}

describe('labs in a real browser', () => {
  it('runs the loop: publish from a template, fix and self-check, submit, grade, override, return, and mail the student', async () => {
    const problems: string[] = [];
    const instructorContext = await suite.browser.newContext({ viewport: VIEWPORT });
    const studentContext = await suite.browser.newContext({ viewport: VIEWPORT });

    // ── The instructor copies the three-wire lab into the demo class and publishes it. ──
    const teacher = await signIn(instructorContext, DEMO_INSTRUCTOR);
    teacher.on('pageerror', (e) => problems.push(`instructor: ${e.message}`));
    await teacher.goto(`${suite.server.url}/classes`, { waitUntil: 'networkidle' });
    await teacher.getByRole('link', { name: DEMO_CLASS.name }).click();
    await teacher.waitForURL(/\/classes\/[^/]+\/labs$/);
    const classId = teacher.url().split('/').slice(-2)[0]!;
    // A blank lab starts valid; a custom panel layout with a wiring mistake shows the located error under the field.
    await teacher.getByRole('button', { name: 'New blank lab' }).click();
    await teacher.waitForURL(/\/labs\/[^/]+\/edit$/);
    await expect.poll(() => teacher.getByTestId('script-validity').innerText()).toBe('Valid for this panel');
    await teacher.getByText('Custom layout (JSON)').click();
    const layout = { format: 'rungwright.panel', version: 1, id: 'one-button', title: 'One button', devices: [{ id: 'S1', kind: 'pushbutton', label: 'Stop', feeds: '%IX99' }] };
    await teacher.getByLabel('Panel layout JSON').fill(JSON.stringify(layout));
    await expect.poll(() => teacher.getByTestId('layout-errors').innerText()).toMatch(/^devices\[0\]\.feeds: /);
    await teacher.getByLabel('Panel layout JSON').fill(JSON.stringify({ ...layout, devices: [{ ...layout.devices[0], feeds: '%IX1' }] }));
    await expect.poll(() => teacher.getByLabel('Panel preview').innerText()).toMatch(/Preview: One button \(1 devices/);
    // The script was written for the default panel: against this one, its check on K1 is flagged.
    await expect.poll(() => teacher.getByTestId('step-1').innerText()).toMatch(/step 1: "K1"/);
    await teacher.screenshot({ path: `${SHOTS}/lab-author-custom-panel.png`, fullPage: true });
    await teacher.goBack();
    await teacher.waitForURL(/\/classes\/[^/]+\/labs$/);

    await pick(teacher, 'Standard lab template', THREE_WIRE.title);
    await teacher.getByRole('button', { name: 'New lab from template' }).click();
    await teacher.waitForURL(/\/labs\/[^/]+\/edit$/);
    const labId = teacher.url().split('/').slice(-2)[0]!;
    await expect.poll(() => teacher.getByTestId('script-validity').innerText()).toBe('Valid for this panel');
    expect(await teacher.getByTestId('script-points').innerText()).toBe('13');
    // The brief preview is rendered Markdown and ends with the safety caution.
    await expect.poll(() => teacher.getByTestId('lab-brief').innerText()).toMatch(/lock out \/ tag out/);
    // Markup an author pastes is sanitised: no handler runs, no script or frame reaches the page.
    const brief = teacher.getByLabel('Brief (Markdown)');
    await brief.fill(`${THREE_WIRE.brief}\n<img src="x.png" onerror="window.__briefScript = 1"><script>window.__briefScript = 2</script><iframe src="/"></iframe> [a link](javascript:window.__briefScript=3)\n`);
    await expect.poll(() => teacher.getByTestId('lab-brief').innerHTML()).toMatch(/<img src="x.png">/);
    expect(await teacher.getByTestId('lab-brief').innerHTML()).not.toMatch(/onerror|<script|<iframe|javascript:/i);
    expect(await teacher.evaluate(() => (window as { __briefScript?: number }).__briefScript)).toBeUndefined();
    expect(await teacher.getByTestId('lab-brief').locator('h1').innerText()).toBe('Three-wire start/stop');
    // A bad value is flagged under its step, live, and the script is valid again once it is fixed.
    await teacher.getByLabel('Step 3 wait in ms').fill('-5');
    await teacher.getByLabel('Step 3 wait in ms').press('Tab');
    await expect.poll(() => teacher.getByTestId('step-3').innerText()).toMatch(/step 3: "wait" needs a whole number of ms/);
    expect(await teacher.getByTestId('script-validity').innerText()).toBe('1 problem');
    await teacher.getByTestId('step-3').screenshot({ path: `${SHOTS}/lab-author-step-error.png` });
    await teacher.getByLabel('Step 3 wait in ms').fill('100');
    await teacher.getByLabel('Step 3 wait in ms').press('Tab');
    await expect.poll(() => teacher.getByTestId('script-validity').innerText()).toBe('Valid for this panel');
    await teacher.screenshot({ path: `${SHOTS}/lab-author.png`, fullPage: true });

    // Try it on the reference solution that came with the template: full marks, hidden checks shown.
    await pick(teacher, 'Program to try', /^Reference: /);
    await teacher.getByRole('button', { name: 'Try it' }).click();
    await expect.poll(() => teacher.getByTestId('report-score').innerText(), { timeout: 15_000 }).toBe('13 / 13');
    expect(await teacher.getByTestId('grade-report').getByText('hidden').count()).toBe(4);

    await teacher.getByRole('button', { name: 'Publish' }).click();
    await expect
      // Saving re-checks the script on the server before publishing; give a loaded machine time.
      .poll(async () => [await teacher.getByTestId('publish-state').innerText(), ...failedCalls, ...(await teacher.locator('.n-message--error-type').allInnerTexts())], { timeout: 15_000 })
      .toEqual(['published']);
    // A wiring diagram as an attachment (a 1 × 1 PNG; the server checks the type from its bytes).
    await teacher.getByLabel('Attach an image or PDF').setInputFiles({ name: 'wiring-k1-k2.png', mimeType: 'image/png', buffer: Buffer.from(TINY_PNG, 'base64') });
    await expect.poll(() => teacher.getByRole('region', { name: 'Attachments' }).innerText()).toMatch(/wiring-k1-k2\.png/);
    await teacher.screenshot({ path: `${SHOTS}/lab-author-try-it.png`, fullPage: true });

    // ── A student opens it, self-checks the starter, is shown the failing moment, fixes it. ──
    const student = await signIn(studentContext, DEMO_STUDENTS[0]!);
    student.on('pageerror', (e) => problems.push(`student: ${e.message}`));
    await student.goto(`${suite.server.url}/classes`, { waitUntil: 'networkidle' });
    await student.getByRole('link', { name: DEMO_CLASS.name }).click();
    await student.waitForURL(/\/classes\/[^/]+\/labs$/);
    await student.locator(`a[href="/labs/${labId}"]`).click();
    await student.waitForURL(new RegExp(`/labs/${labId}$`));
    await student.getByTestId('rung-canvas').waitFor();
    await expect.poll(() => student.getByTestId('lab-brief').innerText()).toMatch(/Three-wire start\/stop/);
    expect(await student.getByText(/lock out \/ tag out/).count()).toBeGreaterThan(0);
    const attachment = student.getByRole('link', { name: 'wiring-k1-k2.png' });
    const bytes = await student.evaluate(async (href) => {
      const res = await fetch(href);
      return { status: res.status, type: res.headers.get('content-type'), size: (await res.arrayBuffer()).byteLength };
    }, (await attachment.getAttribute('href'))!);
    expect(bytes).toEqual({ status: 200, type: expect.stringMatching(/^image\/png/), size: Buffer.from(TINY_PNG, 'base64').length });
    expect(await student.getByTestId('lab-brief').innerHTML()).not.toMatch(/onerror|<script|<iframe|javascript:/i);
    expect(await student.evaluate(() => (window as { __briefScript?: number }).__briefScript)).toBeUndefined();
    await expect.poll(() => student.getByTestId('save-status').innerText()).toMatch(/Saved · version 1/);

    // The brief folds away from the keyboard so the rungs get its width, and stays folded for this student.
    const fold = student.getByRole('button', { name: 'Brief', exact: true });
    expect(await fold.getAttribute('aria-expanded')).toBe('true');
    const canvasWidth = async () => (await student.getByTestId('rung-canvas').boundingBox())!.width;
    const widthWithBrief = await canvasWidth();
    await fold.focus();
    await student.keyboard.press('Enter');
    await expect.poll(() => fold.getAttribute('aria-expanded')).toBe('false');
    expect(await student.getByTestId('lab-brief').isVisible()).toBe(false);
    await expect.poll(canvasWidth).toBeGreaterThan(widthWithBrief + 300);
    await student.reload({ waitUntil: 'networkidle' });
    await expect.poll(() => student.getByTestId('save-status').innerText()).toMatch(/Saved · version 1/);
    expect(await fold.getAttribute('aria-expanded')).toBe('false');
    await fold.focus();
    await student.keyboard.press('Enter');
    await expect.poll(() => student.getByTestId('lab-brief').isVisible()).toBe(true);

    await student.getByRole('button', { name: 'Self-check' }).click();
    const sealIn = student.getByTestId('grade-report').locator('li', { hasText: 'S2 starts the belt' });
    await expect.poll(() => sealIn.innerText()).toMatch(/closed[\s\S]*open/);
    await sealIn.getByRole('button', { name: 'Show me' }).click();
    // Check 6 is at 900 ms: 100 ms settling, then S2 held 100 ms and released for 700 ms.
    await expect.poll(() => student.getByRole('toolbar', { name: 'Simulation' }).innerText()).toMatch(/0\.90 s/);
    await student.screenshot({ path: `${SHOTS}/lab-student-show-me.png` });

    // Rung 1: seal in on K1's auxiliary contact below the start button, stop in series ahead of both.
    const canvasBox = (await student.getByTestId('rung-canvas').boundingBox())!;
    const start = elementPoint(THREE_WIRE.starter, THREE_WIRE.starter.rungs[0]!.network.items[0]!.id);
    await student.mouse.click(canvasBox.x + start.x, canvasBox.y + start.y);
    await student.getByTestId('rung-canvas').press('b');
    const branched = withBranch([[contact('a', 'Fwd_PB')], []]);
    await student.dragAndDrop('[data-palette="contact:no"]', '[data-testid="rung-canvas"]', { targetPosition: slotPoint(branched, [0, 1], 0) });
    await setOperand(student, 'K1_Aux');
    const sealed = withBranch([[contact('a', 'Fwd_PB')], [contact('b', 'K1_Aux')]]);
    await student.dragAndDrop('[data-palette="contact:no"]', '[data-testid="rung-canvas"]', { targetPosition: slotPoint(sealed, [], 0) });
    await setOperand(student, 'Stop_PB');
    // Rungs 2 and 3 by keyboard: green lamp while K1 is closed, red lamp while it is open.
    await typeRung(student, 'c', 'K1_Aux', 'Green_Lamp');
    await typeRung(student, 'Shift+C', 'K1_Aux', 'Red_Lamp');
    await student.screenshot({ path: `${SHOTS}/lab-student-edited.png` });

    await student.getByRole('button', { name: 'Self-check' }).click();
    await expect.poll(() => student.getByTestId('report-score').innerText()).toBe('7 / 7');
    await student.screenshot({ path: `${SHOTS}/lab-student-self-check.png` });

    await student.getByTestId('rung-canvas').press('Control+s');
    await student.getByLabel('Version message').fill('Seal-in on K1 auxiliary, lamps');
    await student.getByLabel('Version message').press('Enter');
    await expect.poll(() => student.getByTestId('save-status').innerText()).toMatch(/Saved · version 2/);

    await student.getByRole('button', { name: 'Save and submit…' }).click();
    await expect.poll(() => student.getByTestId('submit-confirm').innerText()).toMatch(/version 2/);
    await student.getByRole('button', { name: 'Submit version 2' }).click();
    await expect.poll(() => student.getByTestId('submission-status').innerText(), { timeout: 20_000 }).toMatch(/graded/);
    // A lab from a template is worth its checks' points (13); every check passes, so the auto score is all of them.
    await expect.poll(() => student.getByTestId('submission-score').innerText()).toMatch(/Score: 13 \/ 13/);
    await expect.poll(() => student.getByTestId('hidden-summary').innerText()).toMatch(/Hidden checks: 4 passed, 0 failed/);
    // Hidden checks stay hidden: their labels never reach the student's page.
    expect(await student.getByText('after the overload reset the belt stays stopped').count()).toBe(0);
    await student.screenshot({ path: `${SHOTS}/lab-student-graded.png` });

    // ── The instructor reviews it in the table, overrides with a reason and returns it with feedback. ──
    await teacher.goto(`${suite.server.url}/labs/${labId}/submissions`, { waitUntil: 'networkidle' });
    const row = teacher.getByTestId('submissions-table').locator('tr', { hasText: 'Ana Reyes' });
    await expect.poll(() => row.innerText()).toMatch(/13 \/ 13/);
    await teacher.screenshot({ path: `${SHOTS}/lab-submissions.png` });
    await row.getByRole('link', { name: 'Open' }).click();
    await teacher.waitForURL(/\/submissions\/[^/]+$/);
    await teacher.getByTestId('grade-report').waitFor();
    await teacher.getByRole('button', { name: 'Replay the check run' }).click();
    await expect.poll(() => teacher.getByText(/Replayed through step/).innerText()).toMatch(/Replayed through step \d+/);
    await teacher.getByLabel('Override score').fill('10');
    await teacher.getByLabel('Override reason').fill('Rung comments missing');
    await teacher.getByRole('button', { name: 'Override score' }).click();
    await expect.poll(() => teacher.getByTestId('final-score').innerText()).toBe('10');
    await teacher.getByLabel('Feedback').fill('Good seal-in on the auxiliary contact. Comment your rungs next time.');
    await teacher.getByRole('button', { name: 'Return to student' }).click();
    await expect.poll(() => teacher.getByTestId('review-status').innerText()).toBe('returned');
    await teacher.screenshot({ path: `${SHOTS}/lab-review.png`, fullPage: true });

    await teacher.goto(`${suite.server.url}/classes/${classId}/labs`, { waitUntil: 'networkidle' });
    await teacher.getByRole('link', { name: 'Gradebook' }).click();
    await teacher.waitForURL(new RegExp(`/classes/${classId}/gradebook$`));
    await expect.poll(() => teacher.getByTestId('gradebook').innerText()).toMatch(/Ana Reyes[\s\S]*10/);
    await teacher.locator('[data-testid="gradebook"] .n-base-loading').waitFor({ state: 'detached' }).catch(() => undefined);
    await teacher.screenshot({ path: `${SHOTS}/lab-gradebook.png` });

    // ── The student sees the returned grade, and the mail reached the local fake mailbox. ──
    await student.reload({ waitUntil: 'networkidle' });
    await student.getByRole('tab', { name: 'Submissions' }).click();
    await expect.poll(() => student.getByTestId('feedback').innerText()).toMatch(/Rung comments missing[\s\S]*Comment your rungs/);
    await expect.poll(() => student.getByTestId('submission-score').innerText()).toMatch(/Score: 10 \/ 13/);
    await student.screenshot({ path: `${SHOTS}/lab-student-returned.png` });

    const adminContext = await suite.browser.newContext();
    const admin = await signIn(adminContext, DEMO_ADMIN);
    await expect
      .poll(
        async () => {
          const { mail } = await admin.evaluate(async () => (await (await fetch('/api/dev/mail')).json()) as { mail: SentMailEntry[] });
          return mail.filter((m) => m.to.includes(DEMO_STUDENTS[0]!.email)).map((m) => `${m.subject} | ${m.text}`);
        },
        { timeout: 10_000 },
      )
      .toEqual(expect.arrayContaining([expect.stringMatching(/^Returned: Three-wire[\s\S]*10 of 13 points[\s\S]*Comment your rungs/)]));

    expect([...problems, ...failedCalls]).toEqual([]);
    await adminContext.close();
    await instructorContext.close();
    await studentContext.close();
  }, 240_000);
});
