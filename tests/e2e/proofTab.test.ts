/**
 * The workbench's Proof tab, end to end on the real server and Chromium: a student whose
 * forward/reverse program has no interlock adds "never together" for the two contactor outputs,
 * runs it, gets the shortest counterexample, plays it step by step until both contactors are
 * commanded on the panel, keeps it as a check; after a reload the property and the check are
 * still there; the program fixed, the property is proved. A long search stopped is unknown, never
 * proved; a property naming something the program lacks is listed as not decided while the others
 * run; a second student in the same browser does not see the first one's sheet; and no
 * Content Security Policy violation happens on the way (the prover runs in a module worker).
 * Needs the server's proof-sheet routes (`GET/PUT /api/programs/:id/proof`).
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_INSTRUCTOR, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { build, conveyorTags, FORWARD_REVERSE, STANDARD_LABS } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';
import type { Property } from '@shared/proof';
import { MISTAKES } from '../unit/labs/mistakes';
import { LAB_CASES } from '../unit/proof/labProperties';
import { axeFindings, FAILING_IMPACTS } from './support/accessibility';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();

const noInterlock = MISTAKES.find((m) => m.lab === 'forward-reverse' && m.name === 'no interlocks at all')!.program;

/** Two 100 s timers on two buttons: every ET value is a state, so the search runs for many seconds. */
const { buildProgram, rung, no, block, coil } = build;
const slowProgram = buildProgram('Two long timers', 'A large state space for the Stop test.', conveyorTags(), [
  rung('', no('Fwd_PB'), block('TON', 'T1', { PT: 'T#100s' })),
  rung('', no('Rev_PB'), block('TON', 'T2', { PT: 'T#100s' })),
  rung('', no('T1.Q'), no('T2.Q'), coil('Amber_Lamp')),
]);

async function watchViolations(page: Page): Promise<string[]> {
  const violations: string[] = [];
  await page.exposeFunction('reportViolation', (text: string) => violations.push(text));
  await page.addInitScript(
    `document.addEventListener('securitypolicyviolation', (e) => window.reportViolation(e.violatedDirective + ' ' + (e.blockedURI || '') + ' ' + (e.sourceFile || '') + ':' + e.lineNumber));`,
  );
  page.on('console', (message) => {
    if (message.type() === 'error' && /Content Security Policy/i.test(message.text())) violations.push(message.text());
  });
  return violations;
}

async function createProgram(page: Page, program: Program): Promise<string> {
  return page.evaluate(async (doc) => {
    const res = await fetch('/api/programs', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ title: doc.title, document: doc }) });
    if (!res.ok) throw new Error(`create answered ${res.status}: ${await res.text()}`);
    return ((await res.json()) as { program: { id: string } }).program.id;
  }, program);
}

async function saveVersion(page: Page, id: string, baseVersion: number, program: Program): Promise<void> {
  await page.evaluate(
    async ({ id, baseVersion, doc }) => {
      const res = await fetch(`/api/programs/${id}/versions`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ baseVersion, document: doc, message: 'interlocked' }) });
      if (!res.ok) throw new Error(`save answered ${res.status}: ${await res.text()}`);
    },
    { id, baseVersion, doc: program },
  );
}

async function openProofTab(page: Page, id: string): Promise<void> {
  await page.goto(`${suite.server.url}/programs/${id}`, { waitUntil: 'networkidle' });
  await page.getByTestId('rung-canvas').waitFor();
  await page.getByRole('tab', { name: 'Proof' }).click();
  await page.getByTestId('proof-panel').waitFor();
  await expect.poll(() => page.getByText('Loading the proof sheet…').count()).toBe(0);
}

const verdicts = (page: Page) => page.getByTestId('proof-panel').getByTestId('verdict').allInnerTexts();

async function addJsonProperty(page: Page, property: Property): Promise<void> {
  await page.getByTestId('add-property-open').click();
  await page.getByTestId('template').selectOption('json');
  await page.getByTestId('property-json').fill(JSON.stringify(property));
  await page.getByRole('button', { name: 'Add property' }).click();
}

describe('the Proof tab', () => {
  it('refutes a missing interlock with the shortest sequence, plays it on the panel, keeps it as a check and proves the fixed program', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[0]!);
    const violations = await watchViolations(page);
    const id = await createProgram(page, { ...noInterlock, title: 'Forward / reverse, no interlock' });
    await openProofTab(page, id);

    // "Never together" for the two contactor outputs, built from the panel: its plain words first.
    await page.getByTestId('add-property-open').click();
    await page.getByTestId('template').selectOption('never-together');
    await page.getByTestId('never-a').selectOption('%QX1');
    await page.getByTestId('never-b').selectOption('%QX2');
    await expect.poll(() => page.getByTestId('property-preview').innerText()).toBe('Adds: “K1 and K2 are never commanded together”');
    await page.getByRole('button', { name: 'Add property' }).click();
    const row = page.getByTestId('property').filter({ hasText: 'K1 and K2 are never commanded together' });
    await row.waitFor();

    // A typo in the advanced field is named with its place, live.
    await page.getByTestId('add-property-open').click();
    await page.getByTestId('template').selectOption('json');
    await page.getByTestId('property-json').fill('{ "never": { "%QX1": true, } }');
    await expect.poll(() => page.getByTestId('property-problems').innerText()).toMatch(/^line 1, column \d+:/);
    await page.getByTestId('property-json').fill('{ "after": { "S1": "pressed" }, "within": -5, "expect": { "K1": "open" } }');
    await expect.poll(() => page.getByTestId('property-problems').innerText()).toMatch(/^within: /);
    await page.getByRole('button', { name: 'Cancel' }).click();

    await page.getByTestId('run-all').click();
    await expect.poll(() => row.getByTestId('verdict').innerText(), { timeout: 15_000 }).toBe('Refuted');
    expect(await row.getByTestId('figures').innerText()).toMatch(/^\d[\d,]* states · \d+ ms · counterexample of 4 steps, 10 ms$/);
    await page.getByTestId('proof-notes').locator('summary').click();
    expect(await page.getByTestId('proof-notes').innerText()).toMatch(/overload thermal image is not modelled/);
    await page.screenshot({ path: `${SHOTS}/proof-refuted-1280.png` });

    // Play it: the dock turns to the panel, with the steps over it.
    await row.getByTestId('play').click();
    const player = page.getByTestId('proof-player');
    await player.waitFor();
    expect(await page.getByRole('tab', { name: 'Panel' }).getAttribute('aria-selected')).toBe('true');
    const steps = await player.getByTestId('player-step').allInnerTexts();
    // The shortest sequence: both start buttons pressed together, one scan.
    expect(steps).toEqual(['press S2', 'press S3', 'wait 10 ms']);
    expect(await player.getByTestId('player-violation').innerText()).toBe('the property breaks: K1 and K2 are commanded');
    const commanded = async (id: string) => page.locator(`[data-device="${id}"]`).getAttribute('aria-label');
    await player.getByTestId('player-next').click();
    await expect.poll(() => player.getByTestId('player-status').innerText()).toMatch(/^Step 1 of 4/);
    await player.getByTestId('player-next').click();
    await player.getByTestId('player-next').click();
    await expect.poll(() => player.getByTestId('player-status').innerText()).toBe('Step 3 of 4 · 10 ms after power-up');
    const k1 = await commanded('K1');
    const k2 = await commanded('K2');
    expect(k1).toMatch(/coil energised/);
    expect(k2).toMatch(/coil energised/);
    await page.screenshot({ path: `${SHOTS}/proof-playing-1280.png` });
    await player.getByRole('button', { name: 'Back' }).click();
    await expect.poll(() => player.getByTestId('player-status').innerText()).toMatch(/^Step 2 of 4 · 0 ms/);
    await player.getByTestId('player-end').click();
    await expect.poll(() => player.getByTestId('player-status').innerText()).toMatch(/^Step 4 of 4/);

    // Keep it as a check; after a reload the property and the check are there.
    await page.getByRole('tab', { name: 'Proof' }).click();
    await row.getByTestId('save-check').click();
    await expect.poll(() => row.getByTestId('save-check').innerText()).toBe('Saved as check');
    await page.waitForTimeout(800);
    await openProofTab(page, id);
    await page.getByTestId('property').filter({ hasText: 'K1 and K2 are never commanded together' }).waitFor();
    const saved = page.getByTestId('saved-check');
    expect(await saved.count()).toBe(1);
    expect(await saved.first().innerText()).toMatch(/K1 and K2 are never commanded together/);
    await saved.first().getByTestId('run-saved').click();
    expect(await saved.first().getByTestId('saved-check-outcome').innerText()).toMatch(/^Passes/);

    // Fixed (the reference solution saved as a new version): proved; the saved check now fails.
    await saveVersion(page, id, 1, { ...FORWARD_REVERSE.solution, title: 'Forward / reverse, interlocked' });
    await openProofTab(page, id);
    await page.getByTestId('run-all').click();
    const fixedRow = page.getByTestId('property').filter({ hasText: 'K1 and K2 are never commanded together' });
    await expect.poll(() => fixedRow.getByTestId('verdict').innerText(), { timeout: 15_000 }).toBe('Proved');
    await page.getByTestId('saved-check').first().getByTestId('run-saved').click();
    expect(await page.getByTestId('saved-check-outcome').innerText()).toMatch(/^Fails — fails at step 4/);

    // An edit after the run makes the result stale, and says so.
    await page.getByTestId('rung-canvas').focus();
    await page.keyboard.press('Control+Enter');
    await page.getByRole('tab', { name: 'Proof' }).click();
    await expect.poll(() => fixedRow.getByTestId('stale').count()).toBe(1);

    const findings = await axeFindings(page);
    expect(findings.filter((f) => (FAILING_IMPACTS as readonly string[]).includes(f.impact))).toEqual([]);
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.screenshot({ path: `${SHOTS}/proof-stale-1920.png` });
    expect(violations).toEqual([]);
    await context.close();
  }, 120_000);

  it('Stop ends a long run at once and leaves unknown, never proved; a second student does not see the first one’s sheet', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[0]!);
    const violations = await watchViolations(page);
    const id = await createProgram(page, slowProgram);
    await openProofTab(page, id);
    await addJsonProperty(page, { never: { P3: 'lit' }, label: 'the amber lamp stays dark' });
    await page.getByTestId('property').filter({ hasText: 'the amber lamp stays dark' }).waitFor();
    await page.getByTestId('run-all').click();
    await expect.poll(() => page.getByTestId('progress').innerText(), { timeout: 10_000 }).toMatch(/Exploring: [\d,]+ states/);
    await page.screenshot({ path: `${SHOTS}/proof-running-1280.png` });
    // Measured in the page: from the click to the verdict on screen.
    const stoppedAfter = await page.evaluate(
      () =>
        new Promise<number>((resolve) => {
          const clicked = performance.now();
          document.querySelector<HTMLButtonElement>('[data-testid="stop"]')!.click();
          const look = () => (document.querySelector('[data-testid="verdict"]')?.textContent === 'Unknown' ? resolve(performance.now() - clicked) : requestAnimationFrame(look));
          look();
        }),
    );
    expect(await verdicts(page)).toEqual(['Unknown']);
    expect(await page.getByTestId('reason').innerText()).toMatch(/^stopped by you after [\d]+ states/);
    // The page answered while the search ran: it is in a worker.
    expect(await page.evaluate(() => 1 + 1)).toBe(2);
    console.log(`Proof tab: Stop ended the run ${Math.round(stoppedAfter)} ms after the click`);
    expect(violations).toEqual([]);
    await page.waitForTimeout(800);

    // Another student in the same browser: signed out and in again, their own program, an empty sheet.
    await page.evaluate(() => fetch('/api/auth/sign-out', { method: 'POST' }));
    await context.clearCookies();
    const other = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[1]!);
    const theirs = await createProgram(other, slowProgram);
    await openProofTab(other, theirs);
    expect(await other.getByTestId('property').count()).toBe(0);
    const answer = await other.evaluate(async (programId) => (await fetch(`/api/programs/${programId}/proof`)).status, id);
    expect([403, 404]).toContain(answer);
    await context.close();
  }, 120_000);

  it('runs the other properties when one names something the program lacks, and says which one was not decided', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[1]!);
    const violations = await watchViolations(page);
    const id = await createProgram(page, { ...FORWARD_REVERSE.solution, title: 'Forward / reverse, one stray property' });
    await openProofTab(page, id);
    await addJsonProperty(page, { never: { '%QX1': true, '%QX2': true }, label: 'the interlock holds' });
    await addJsonProperty(page, { never: { Old_Lamp: true }, label: 'a tag since deleted' });
    await expect.poll(() => page.getByTestId('property').count()).toBe(2);
    await page.getByTestId('run-all').click();
    const good = page.getByTestId('property').filter({ hasText: 'the interlock holds' });
    await expect.poll(() => good.getByTestId('verdict').innerText(), { timeout: 15_000 }).toBe('Proved');
    expect(await verdicts(page)).toEqual(['Proved']);
    const refused = await page.getByTestId('run-refused').innerText();
    expect(refused).toMatch(/^Not decided \(the other properties were\):/);
    expect(refused).toMatch(/property 2 \(a tag since deleted\): "Old_Lamp" names nothing in this program/);
    await page.screenshot({ path: `${SHOTS}/proof-one-refused-1280.png` });
    expect(violations).toEqual([]);
    await context.close();
  }, 120_000);

  it('in a lab, lists the properties its visible checks prove, read-only, and runs them on the student’s copy', async () => {
    const staff = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const instructor = await signInThroughPage(staff, suite.server.url, DEMO_INSTRUCTOR);
    const labId = await instructor.evaluate(async () => {
      const { classes } = (await (await fetch('/api/classes')).json()) as { classes: { id: string }[] };
      const { labs } = (await (await fetch(`/api/classes/${classes[0]!.id}/labs`)).json()) as { labs: { id: string; title: string }[] };
      const id = labs.find((l) => /^Forward/.test(l.title))!.id;
      const { lab } = (await (await fetch(`/api/labs/${id}`)).json()) as { lab: { script: { steps: unknown[] } } };
      const script = { ...lab.script, steps: [...lab.script.steps, { prove: { never: { '%QX1': true, '%QX2': true } }, label: 'the interlock holds', points: 1 }] };
      const res = await fetch(`/api/labs/${id}`, { method: 'PATCH', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ script }) });
      if (!res.ok) throw new Error(`PATCH answered ${res.status}: ${await res.text()}`);
      return id;
    });
    await staff.close();

    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[0]!);
    await page.goto(`${suite.server.url}/labs/${labId}`, { waitUntil: 'networkidle' });
    await page.getByTestId('rung-canvas').waitFor();
    await page.getByRole('tab', { name: 'Proof' }).click();
    const labSection = page.getByRole('region', { name: 'This lab’s properties' }).or(page.locator('section[aria-labelledby="lab-properties-title"]'));
    const row = labSection.getByTestId('property').filter({ hasText: 'the interlock holds' });
    await row.waitFor();
    expect(await row.getByRole('button', { name: 'Delete' }).count()).toBe(0);
    await row.getByTestId('run-one').click();
    await expect.poll(() => row.getByTestId('verdict').innerText(), { timeout: 15_000 }).toBe('Proved');
    await page.screenshot({ path: `${SHOTS}/proof-lab-1280.png` });
    await context.close();
  }, 120_000);

  it('decides the seven standard labs’ reference solutions in the worker (times printed)', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 1920, height: 1080 } });
    const page = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[2] ?? DEMO_STUDENTS[0]!);
    const times: string[] = [];
    const labsDone = new Set<string>();
    for (const lab of STANDARD_LABS) {
      const properties = LAB_CASES.filter((c) => c.lab === lab.id).flatMap((c) => c.properties);
      const unique = [...new Map(properties.map((p) => [JSON.stringify(p), p])).values()];
      if (unique.length === 0 || labsDone.has(lab.id)) continue;
      labsDone.add(lab.id);
      const id = await createProgram(page, { ...lab.solution, title: `${lab.title} (reference)` });
      await openProofTab(page, id);
      for (const p of unique) await addJsonProperty(page, p);
      await expect.poll(() => page.getByTestId('property').count()).toBe(unique.length);
      const started = Date.now();
      await page.getByTestId('run-all').click();
      await expect.poll(async () => (await verdicts(page)).length, { timeout: 30_000 }).toBe(unique.length);
      const wall = Date.now() - started;
      expect(await verdicts(page)).toEqual(unique.map(() => 'Proved'));
      const figures = await page.getByTestId('figures').allInnerTexts();
      times.push(`${lab.id}: ${unique.length} properties, ${wall} ms from Run to verdicts (${figures.join('; ')})`);
    }
    console.log(`Proof tab, reference solutions in the worker:\n${times.join('\n')}`);
    expect(labsDone.size).toBe(STANDARD_LABS.length);
    await context.close();
  }, 240_000);
});
