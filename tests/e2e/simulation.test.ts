/**
 * The simulator in a real browser (Debian's Chromium, the real server): the demo three-wire program
 * run against the default panel — start, seal-in, e-stop, e-stop reset, the two-wire restart, and
 * the overload trip: K1 drops and stays dropped after the reset, and %QX1 is ON with K1 open while
 * S2 is held on the tripped overload. The rungs are the workbench's canvas, so
 * their states are read from the page's "Rung states as text" list and the canvas's pixels. A
 * screenshot at each point goes to tests/e2e/screenshots/ (git-ignored) to be looked at.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { layoutProgram } from '@/editor/layout';
import { threeWireProgram } from '@/simulation/demoPrograms';
import { SHOTS, useBrowserSuite } from './support/browserSuite';

const suite = useBrowserSuite();
let page: Page;

beforeAll(async () => {
  page = await suite.browser.newPage({ viewport: { width: 1280, height: 720 } });
});

const shot = (name: string) => page.screenshot({ path: `${SHOTS}/${name}.png` });
const deviceLabel = (id: string) => page.locator(`[data-device="${id}"] [role="img"], [data-device="${id}"][role="img"]`).first().getAttribute('aria-label');
const contactor = (id: string) => page.locator(`[data-device="${id}"]`).getAttribute('aria-label');
const inputBits = () => page.locator('table.inputs tr[data-address] td.bit').allInnerTexts();
const outputRow = (address: string) => page.locator(`table.outputs tr[data-address="${address}"] td.bit`).innerText();
const reason = (address: string) => page.locator(`td[data-reason="${address}"]`).innerText();
const motorWord = async () => (await deviceLabel('M1'))?.split(': ')[1]?.split(',')[0];

/**
 * Pixels in the energised amber (#d98a1c) on the rung canvas's live layer (the second of its
 * canvases), around the coil `coilId` of the three-wire demo: from 40 px left of its box to its
 * right edge, over its rung's height. Program coordinates = canvas coordinates (zoom 1, unscrolled).
 */
const amberAtCoil = (coilId: string) => {
  const layout = layoutProgram(threeWireProgram());
  const rung = layout.rungs.find((r) => r.elements.some((b) => b.id === coilId))!;
  const box = rung.elements.find((b) => b.id === coilId)!;
  const area = { x: box.x - 40, y: rung.top, w: box.width + 40, h: rung.height };
  return page.locator('[data-testid="rung-canvas"] canvas').nth(1).evaluate((canvas: HTMLCanvasElement, a: typeof area) => {
    const scale = canvas.width / canvas.clientWidth;
    const { data } = canvas.getContext('2d')!.getImageData(a.x * scale, a.y * scale, a.w * scale, a.h * scale);
    let n = 0;
    for (let i = 0; i < data.length; i += 4) if (data[i + 3]! > 200 && Math.abs(data[i]! - 0xd9) < 12 && Math.abs(data[i + 1]! - 0x8a) < 12 && Math.abs(data[i + 2]! - 0x1c) < 12) n += 1;
    return n;
  }, area);
};

async function openDemo(id: string): Promise<void> {
  await page.goto(`${suite.server.url}/simulator/${id}`, { waitUntil: 'networkidle' });
  await page.getByRole('button', { name: '▶ Run' }).waitFor();
}

async function runAtRun(): Promise<void> {
  await page.getByRole('button', { name: '▶ Run' }).click();
  await page.locator('[data-device="S4"]').getByRole('radio', { name: 'RUN' }).click();
}

/** Hold a pushbutton with the mouse until `until` holds, then let go. */
async function holdWithMouse(id: string, until: () => Promise<boolean>): Promise<void> {
  const cap = page.locator(`[data-device="${id}"] button.cap`);
  await cap.scrollIntoViewIfNeeded();
  const box = (await cap.boundingBox())!;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.mouse.down();
  await expect.poll(until, { timeout: 5000 }).toBe(true);
  await page.mouse.up();
}

describe('the simulator on the default panel in a real browser', () => {
  it('starts the three-wire demo with S2 and keeps it running, sealed in, after S2 is released', async () => {
    await openDemo('three-wire');
    await shot('simulation-1-open');
    await runAtRun();
    // Held until K1 pulls in, as on the real panel: the seal is K1's auxiliary contact, which closes
    // only after K1's 25 ms pick-up, so a tap shorter than that does not seal in (tests/unit/simulation/session.test.ts).
    await holdWithMouse('S2', async () => /carrier closed/.test((await contactor('K1')) ?? ''));
    await page.waitForTimeout(400);
    expect(await page.locator('[data-device="S2"] button.cap').getAttribute('aria-pressed')).toBe('false');
    expect(await contactor('K1')).toMatch(/carrier closed/);
    await expect.poll(motorWord).toBe('forward');
    // The seal-in rung: energised at its right end, power through K1's auxiliary contact in the seal-in branch.
    await page.getByText('Rung states as text').click();
    await expect.poll(() => page.locator('[data-rung="r1"]').getAttribute('data-energised')).toBe('true');
    expect(await page.locator('[data-element="r1n3"]').getAttribute('data-state')).toBe('open');
    expect(await page.locator('[data-element="r1n5"]').getAttribute('data-state')).toBe('closed');
    expect(await page.locator('[data-element="r1n8"]').getAttribute('data-state')).toBe('energised');
    // The reverse rung (K2) stays de-energised.
    expect(await page.locator('[data-rung="r2"]').getAttribute('data-energised')).toBe('false');
    // On the canvas: power flows into K1's coil in amber; K2's coil, not energised, shows none.
    expect(await amberAtCoil('r1n8')).toBeGreaterThan(40);
    expect(await amberAtCoil('r2n8')).toBe(0);
    await shot('simulation-2-sealed-in');
  });

  it('drops every input and K1 on the e-stop, and stays stopped when the e-stop is reset', async () => {
    await page.locator('[data-device="S0"] button.mushroom').click();
    await expect.poll(async () => (await inputBits()).every((b) => b.startsWith('FALSE'))).toBe(true);
    await expect.poll(() => contactor('K1')).toMatch(/carrier open/);
    // The forward rung loses its power at once, in the list and on the canvas.
    await expect.poll(() => page.locator('[data-rung="r1"]').getAttribute('data-energised')).toBe('false');
    await expect.poll(() => amberAtCoil('r1n8')).toBe(0);
    expect(await page.locator('.field-panel .commons').innerText()).toMatch(/Input common de-energised \(S0 11-12 open\)/);
    await shot('simulation-3-estop-pressed');
    await expect.poll(motorWord, { timeout: 5000 }).toBe('stopped');
    await page.locator('[data-device="S0"] button.mushroom').click();
    await page.waitForTimeout(700);
    expect(await contactor('K1')).toMatch(/carrier open/);
    expect(await motorWord()).toBe('stopped');
    expect(await outputRow('%QX1')).toBe('OFF');
    await shot('simulation-4-estop-reset-stays-stopped');
  });

  it('restarts a two-wire program by itself when the e-stop is reset', async () => {
    await page.getByLabel('Demo program').selectOption('two-wire');
    await page.waitForURL(/\/simulator\/two-wire$/);
    await runAtRun();
    await expect.poll(() => contactor('K1')).toMatch(/carrier closed/);
    await page.locator('[data-device="S0"] button.mushroom').click();
    await expect.poll(() => contactor('K1')).toMatch(/carrier open/);
    await page.locator('[data-device="S0"] button.mushroom').click();
    await expect.poll(() => contactor('K1')).toMatch(/carrier closed/);
    await expect.poll(motorWord).toBe('forward');
    await shot('simulation-5-two-wire-restarted');
  });

  it('trips the overload on a running motor: K1 drops, the seal breaks, and %QX1 ON with K1 open says why', async () => {
    await openDemo('three-wire');
    await runAtRun();
    // Hold S2 from the keyboard this time (its key is 2).
    await page.keyboard.down('2');
    await expect.poll(() => contactor('K1')).toMatch(/carrier closed/);
    await page.keyboard.up('2');
    await expect.poll(motorWord).toBe('forward');
    await page.getByRole('button', { name: 'Trip test F1' }).click();
    await expect.poll(() => contactor('K1')).toMatch(/carrier open/);
    // Sealed in on K1's auxiliary contact: the seal broke with K1, so the output is OFF too.
    await expect.poll(() => outputRow('%QX1')).toBe('OFF');
    expect(await page.locator('.event-log').innerText()).toContain('K1 dropped out: F1 95-96 opened');
    // Holding S2 commands K1 again: the output is ON, the contactor stays open, and the table says why.
    await page.keyboard.down('2');
    await expect.poll(() => outputRow('%QX1')).toBe('ON');
    expect(await contactor('K1')).toMatch(/carrier open/);
    expect(await reason('%QX1')).toBe('%QX1 ON, K1 open (F1 95-96 open)');
    await shot('simulation-6-overload-tripped');
    await page.keyboard.up('2');
    await page.locator('.dock').screenshot({ path: `${SHOTS}/simulation-7-dock.png` });
    await page.locator('.dock').evaluate((el) => (el.scrollTop = el.scrollHeight));
    await page.locator('.dock').screenshot({ path: `${SHOTS}/simulation-8-dock-scrolled.png` });
  });

  it('reads the trace at the cursor and exports it as CSV and PNG', async () => {
    await page.getByRole('button', { name: '❚❚ Pause' }).click();
    const plot = page.locator('.trace .plot');
    const box = (await plot.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.4, box.y + box.height / 2);
    await expect.poll(() => page.locator('.trace .readout').innerText()).toMatch(/t = \d+\.\d{3} s\s.*%IX1 (TRUE|FALSE)/s);
    const [csv] = await Promise.all([page.waitForEvent('download'), page.locator('.trace').getByRole('button', { name: 'CSV' }).click()]);
    const text = await (await csv.createReadStream()).toArray();
    const lines = Buffer.concat(text as Buffer[]).toString('utf8').trim().split('\n');
    expect(lines[0]).toBe('time_ms,%IX1,%IX2,%QX1,%IX7');
    expect(lines.length).toBeGreaterThan(50);
    expect(lines[1]).toMatch(/^10,1,0,0,0$/);
    const [png] = await Promise.all([page.waitForEvent('download'), page.locator('.trace').getByRole('button', { name: 'PNG' }).click()]);
    expect(png.suggestedFilename()).toBe('rungwright-trace.png');
    await shot('simulation-8b-trace-cursor');
  });

  it('runs the program being edited from the workbench dock and paints its power flow on the canvas', async () => {
    const student = DEMO_STUDENTS[0]!;
    await page.goto(`${suite.server.url}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail').fill(student.email);
    await page.getByLabel('Password').fill(student.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/programs$/);
    const doc = threeWireProgram();
    const id = await page.evaluate(async (program) => {
      const res = await fetch('/api/programs', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ title: program.title, document: program }) });
      if (!res.ok) throw new Error(`create answered ${res.status}: ${await res.text()}`);
      return ((await res.json()) as { program: { id: string } }).program.id;
    }, doc);
    await page.goto(`${suite.server.url}/programs/${id}`, { waitUntil: 'networkidle' });
    await page.locator('[data-testid="rung-canvas"]').waitFor();
    await shot('simulation-9-workbench-stopped');
    await page.locator('.simulation-dock').getByRole('button', { name: '▶ Run' }).click();
    await page.locator('[data-device="S4"]').getByRole('radio', { name: 'RUN' }).click();
    await holdWithMouse('S2', async () => /carrier closed/.test((await contactor('K1')) ?? ''));
    await expect.poll(motorWord).toBe('forward');
    // The canvas is pixels: the live layer paints K1's coil amber, and K2's (not energised) not.
    await expect.poll(() => amberAtCoil('r1n8')).toBeGreaterThan(40);
    expect(await amberAtCoil('r2n8')).toBe(0);
    await shot('simulation-10-workbench-running');
  });
});
