/**
 * A whole workbench session under the production Content Security Policy raises no
 * `securitypolicyviolation`: sign in, open a program, run it, press and hold a start button, edit
 * the program while it runs (each edit recompiles the engine's WebAssembly, which the policy's
 * `'wasm-unsafe-eval'` allows and nothing else needs), stop and run again. The listener is shown
 * to work at the end by a violation made on purpose (an inline script the policy refuses).
 */
import { describe, expect, it } from 'vitest';
import { DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { threeWireProgram } from '@/simulation/demoPrograms';
import { SHOTS, useBrowserSuite } from './support/browserSuite';

const suite = useBrowserSuite();

describe('a workbench session', () => {
  it('edits, runs and recompiles while running without one Content Security Policy violation', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 800 } });
    const violations: string[] = [];
    const problems: string[] = [];
    await page.exposeFunction('reportViolation', (text: string) => violations.push(text));
    await page.addInitScript(
      `document.addEventListener('securitypolicyviolation', (e) => window.reportViolation(e.violatedDirective + ' ' + (e.blockedURI || '') + ' ' + (e.sourceFile || '') + ':' + e.lineNumber));`,
    );
    page.on('pageerror', (error) => problems.push(error.message));
    page.on('console', (message) => {
      if (message.type() === 'error' && /Content Security Policy/i.test(message.text())) problems.push(message.text());
    });

    const student = DEMO_STUDENTS[0]!;
    const response = await page.goto(`${suite.server.url}/sign-in`, { waitUntil: 'networkidle' });
    expect(response?.headers()['content-security-policy']).toMatch(/script-src 'self' 'wasm-unsafe-eval'/);
    expect(response?.headers()['content-security-policy']).not.toMatch(/'unsafe-eval'/);
    await page.getByLabel('E-mail').fill(student.email);
    await page.getByLabel('Password').fill(student.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/programs$/);
    const id = await page.evaluate(async (program) => {
      const res = await fetch('/api/programs', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ title: program.title, document: program }) });
      if (!res.ok) throw new Error(`create answered ${res.status}: ${await res.text()}`);
      return ((await res.json()) as { program: { id: string } }).program.id;
    }, threeWireProgram());
    await page.goto(`${suite.server.url}/programs/${id}`, { waitUntil: 'networkidle' });
    await page.getByTestId('rung-canvas').waitFor();

    // Run, switch S4 to RUN and hold S2 until K1 closes.
    const dock = page.locator('.simulation-dock');
    await dock.getByRole('button', { name: '▶ Run' }).click();
    await page.locator('[data-device="S4"]').getByRole('radio', { name: 'RUN' }).click();
    const k1 = () => page.locator('[data-device="K1"]').getAttribute('aria-label');
    const cap = page.locator('[data-device="S2"] button.cap');
    await cap.scrollIntoViewIfNeeded();
    const box = (await cap.boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await expect.poll(k1, { timeout: 5000 }).toMatch(/carrier closed/);
    await page.mouse.up();

    // Edit while running, by keyboard: a new rung, a contact and a coil with their operands. Every
    // change recompiles (the half-drawn ones are refused and the previous version keeps running).
    await page.getByTestId('rung-canvas').focus();
    await page.keyboard.press('Control+Enter');
    await page.keyboard.press('c');
    await page.keyboard.press('Enter');
    await page.keyboard.type('%IX5');
    await page.keyboard.press('Enter');
    await page.keyboard.press('o');
    await page.keyboard.press('Enter');
    await page.keyboard.type('%QX6');
    await page.keyboard.press('Enter');
    await expect.poll(() => dock.getByLabel('Simulation messages').innerText(), { timeout: 5000 }).toMatch(/Recompiled while running/);
    // Memory was kept across the recompiles: the belt is still sealed in.
    expect(await k1()).toMatch(/carrier closed/);
    await page.screenshot({ path: `${SHOTS}/csp-workbench-recompiled-while-running.png` });

    // Stop and run again, on the dock's Panel tab (inserting an element turned the dock to the inspector).
    await page.getByRole('tab', { name: 'Panel' }).click();
    await dock.getByRole('button', { name: /Pause|Stop/ }).first().click();
    await dock.getByRole('button', { name: '▶ Run' }).click();
    await page.waitForTimeout(500);
    expect(violations).toEqual([]);
    expect(problems).toEqual([]);

    // The listener does see a violation: an inline script, which the policy refuses.
    await page.addScriptTag({ content: 'window.inlineRan = true;' }).catch(() => undefined);
    await expect.poll(() => violations.length).toBe(1);
    expect(violations[0]).toMatch(/^script-src/);
    expect(await page.evaluate('window.inlineRan === true')).toBe(false);
    await page.close();
  });
});
