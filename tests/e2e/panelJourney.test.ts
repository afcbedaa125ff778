/**
 * The student's lab session, the panel half: at 1280×800 a student sees the rung under test, the
 * button they press (S2), the contactor (K1) and the motor (M1) at once, without scrolling, while
 * the simulation runs — on the three-wire lab (brief folded) and on the seeded demo program. At
 * 1920×1080 the dock is wider and draws the panel larger. The dock resizes from its edge (pointer
 * and keys) and remembers the width per place; the I/O and tag tables fit the narrowest dock; the
 * panel's states (e-stop latched, F1 tripped) pass axe in both schemes. Screenshots go to
 * tests/e2e/screenshots/journey-*.png to be looked at.
 */
import { describe, expect, it } from 'vitest';
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { THREE_WIRE } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';
import { layoutProgram } from '@/editor/layout';
import { THREE_WIRE_DEMO } from '../../server/db/demoPrograms';
import { DEMO_CLASS, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { expectAccessible } from './support/accessibility';
import { SHOTS, useBrowserSuite } from './support/browserSuite';
import { signInThroughPage } from './support/signIn';

const suite = useBrowserSuite();
const LAPTOP = { width: 1280, height: 800 };
const WIDE = { width: 1920, height: 1080 };

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

const inside = (box: Box, frame: Box): boolean =>
  box.x >= frame.x - 0.5 && box.y >= frame.y - 0.5 && box.x + box.width <= frame.x + frame.width + 0.5 && box.y + box.height <= frame.y + frame.height + 0.5;

async function boxOf(locator: Locator): Promise<Box> {
  const box = await locator.boundingBox();
  if (!box) throw new Error(`${locator} has no box`);
  return box;
}

/**
 * Where the coil of the program's first rung is on the page: its cell in the canvas's drawing,
 * moved by the canvas's own scroll and zoom. The canvas is pixels, so the layout says where.
 */
async function coilBox(page: Page, program: Program): Promise<{ coil: Box; canvas: Box }> {
  const layout = layoutProgram(program);
  const rung = layout.rungs[0]!;
  const cell = rung.elements.find((b) => b.element.kind === 'coil')!;
  const canvas = page.getByTestId('rung-canvas');
  const view = await canvas.evaluate((el) => ({ left: el.scrollLeft, top: el.scrollTop, width: el.clientWidth, height: el.clientHeight, zoom: Number(el.dataset.zoom) }));
  const frame = await boxOf(canvas);
  return {
    coil: { x: frame.x + cell.x * view.zoom - view.left, y: frame.y + (rung.top + cell.y) * view.zoom - view.top, width: cell.width * view.zoom, height: cell.height * view.zoom },
    // What the canvas shows: its box less the scroll bars.
    canvas: { x: frame.x, y: frame.y, width: view.width, height: view.height },
  };
}

/** S2, K1, M1 and the coil all inside the window and inside the parts of the page that show them. */
async function expectAllInView(page: Page, program: Program, viewport: { width: number; height: number }): Promise<void> {
  const shown = { x: 0, y: 0, ...viewport };
  const pane = await boxOf(page.getByTestId('dock-tabs').getByRole('tabpanel'));
  const devices = Object.fromEntries(await Promise.all(['S2', 'K1', 'M1'].map(async (id) => [id, await boxOf(page.locator(`[data-device="${id}"]`))] as const)));
  const { coil, canvas } = await coilBox(page, program);
  const outside = [
    ...Object.entries(devices).flatMap(([id, box]) => (inside(box, shown) && inside(box, pane) ? [] : [`${id} ${JSON.stringify(box)}`])),
    ...(inside(coil, shown) && inside(coil, canvas) ? [] : [`coil ${JSON.stringify(coil)} in canvas ${JSON.stringify(canvas)}`]),
  ];
  expect(outside).toEqual([]);
  // Without scrolling: neither the page, the dock's pane nor the canvas has moved.
  expect(await page.evaluate(() => [window.scrollX, window.scrollY])).toEqual([0, 0]);
  expect(await page.getByTestId('dock-tabs').getByRole('tabpanel').evaluate((el) => el.scrollTop)).toBe(0);
  expect(await page.getByTestId('rung-canvas').evaluate((el) => [el.scrollLeft, el.scrollTop])).toEqual([0, 0]);
}

/** Holds S2 with the mouse until K1 reports closed; returns with the button still held. */
async function holdS2UntilK1Closes(page: Page): Promise<void> {
  const cap = await boxOf(page.locator('[data-device="S2"] button.cap'));
  await page.mouse.move(cap.x + cap.width / 2, cap.y + cap.height / 2);
  await page.mouse.down();
  await expect.poll(async () => (await page.locator('[data-device="K1"]').getAttribute('aria-label')) ?? '', { timeout: 5000 }).toMatch(/carrier closed/);
  await expect.poll(async () => (await page.locator('[data-device="M1"] [role="img"]').getAttribute('aria-label')) ?? '').toMatch(/: forward/);
}

async function openThreeWireLab(context: BrowserContext, student = DEMO_STUDENTS[2]!): Promise<Page> {
  const page = await signInThroughPage(context, suite.server.url, student);
  await page.goto(`${suite.server.url}/classes`, { waitUntil: 'networkidle' });
  await page.getByRole('link', { name: DEMO_CLASS.name }).click();
  await page.waitForURL(/\/classes\/[^/]+\/labs$/);
  await page.getByRole('link', { name: THREE_WIRE.title }).click();
  await page.waitForURL(/\/labs\/[^/]+$/);
  await page.getByTestId('rung-canvas').waitFor();
  await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved/);
  return page;
}

async function foldBrief(page: Page): Promise<void> {
  const fold = page.getByTestId('brief-toggle');
  if ((await fold.getAttribute('aria-expanded')) === 'true') await fold.click();
  await expect.poll(() => fold.getAttribute('aria-expanded')).toBe('false');
}

async function dockWidth(page: Page): Promise<number> {
  return (await boxOf(page.locator('aside.dock'))).width;
}

describe('the panel and the rungs together (journey 2)', () => {
  it('shows S2, K1, M1 and the rung\'s coil at once at 1280×800 while the student runs the three-wire lab', async () => {
    const context = await suite.browser.newContext({ viewport: LAPTOP });
    const page = await openThreeWireLab(context);
    await foldBrief(page);
    // The rungs are drawn at zoom 1 (canvas text at 11 px or more), not shrunk to fit.
    expect(await page.getByTestId('rung-canvas').getAttribute('data-zoom')).toBe('1');
    await page.locator('[data-testid="dock-tabs"]').getByRole('button', { name: '▶ Run' }).click();
    await holdS2UntilK1Closes(page);
    await expectAllInView(page, THREE_WIRE.starter, LAPTOP);
    await page.screenshot({ path: `${SHOTS}/journey-lab-1280.png` });
    await page.mouse.up();
    await context.close();
  });

  it('shows them at once on the seeded three-wire demo program too, once the safety caution is dismissed', async () => {
    const context = await suite.browser.newContext({ viewport: LAPTOP });
    const page = await signInThroughPage(context, suite.server.url, DEMO_STUDENTS[0]!);
    await page.getByRole('link', { name: THREE_WIRE_DEMO.title }).click();
    await page.waitForURL(/\/programs\/[^/]+$/);
    await page.locator('[data-device="S2"]').waitFor();
    await page.locator('[data-testid="safety-caution"] .n-base-close').click();
    await page.locator('.simulation-dock').getByRole('button', { name: '▶ Run' }).click();
    await page.locator('[data-device="S4"]').getByRole('radio', { name: 'RUN' }).click();
    await holdS2UntilK1Closes(page);
    await expectAllInView(page, THREE_WIRE_DEMO, LAPTOP);
    await page.mouse.up();
    // Sealed in on K1's auxiliary contact, it keeps running after S2 is let go.
    await page.waitForTimeout(300);
    expect(await page.locator('[data-device="K1"]').getAttribute('aria-label')).toMatch(/carrier closed/);
    await page.screenshot({ path: `${SHOTS}/journey-workbench-1280.png` });
    await context.close();
  });

  it('gives the panel a wider dock and larger devices at 1920×1080, with the same four on screen', async () => {
    const context = await suite.browser.newContext({ viewport: WIDE });
    const laptop = await suite.browser.newContext({ viewport: LAPTOP });
    const page = await openThreeWireLab(context);
    const small = await openThreeWireLab(laptop);
    // The brief stays open on the wide screen; the rungs still fit beside it.
    await page.locator('[data-testid="dock-tabs"]').getByRole('button', { name: '▶ Run' }).click();
    await holdS2UntilK1Closes(page);
    await expectAllInView(page, THREE_WIRE.starter, WIDE);
    await page.screenshot({ path: `${SHOTS}/journey-lab-1920.png` });
    await page.mouse.up();
    expect(await dockWidth(page)).toBeGreaterThanOrEqual(560);
    expect(await dockWidth(small)).toBeLessThan(420);
    const capWide = (await boxOf(page.locator('[data-device="S2"] button.cap'))).width;
    const capSmall = (await boxOf(small.locator('[data-device="S2"] button.cap'))).width;
    expect(capWide).toBeGreaterThan(capSmall * 1.2);
    await context.close();
    await laptop.close();
  });

  it('resizes the dock by dragging its edge or with the arrow keys, and remembers the width per place', async () => {
    const context = await suite.browser.newContext({ viewport: LAPTOP });
    const page = await openThreeWireLab(context, DEMO_STUDENTS[1]!);
    const labUrl = page.url();
    await foldBrief(page);
    const handle = page.getByTestId('dock-handle');
    const before = await dockWidth(page);
    const edge = await boxOf(handle);
    await page.mouse.move(edge.x + edge.width / 2, edge.y + 200);
    await page.mouse.down();
    await page.mouse.move(edge.x + edge.width / 2 - 60, edge.y + 200, { steps: 4 });
    await page.mouse.up();
    await expect.poll(() => dockWidth(page)).toBe(before + 60);
    await handle.focus();
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => dockWidth(page)).toBe(before + 36);
    await expect.poll(async () => Number(await handle.getAttribute('aria-valuenow'))).toBe(before + 36);
    await page.reload({ waitUntil: 'networkidle' });
    await page.getByTestId('rung-canvas').waitFor();
    await expect.poll(() => dockWidth(page)).toBe(before + 36);
    // Another place (the program workbench) keeps its own default.
    await page.goto(`${suite.server.url}/programs`, { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: THREE_WIRE_DEMO.title }).click();
    await page.locator('[data-device="S2"]').waitFor();
    const workbenchDock = await dockWidth(page);
    expect(workbenchDock).not.toBe(before + 36);
    // A double-click on the edge puts the lab's default back.
    await page.goto(labUrl, { waitUntil: 'networkidle' });
    await page.getByTestId('rung-canvas').waitFor();
    await page.getByTestId('dock-handle').dblclick();
    await expect.poll(() => dockWidth(page)).toBe(before);
    await context.close();
  });

  it('fits the I/O table and the tag table in the narrowest dock at 1280×800', async () => {
    const context = await suite.browser.newContext({ viewport: LAPTOP });
    const page = await openThreeWireLab(context);
    // With the brief open the dock is at its narrowest.
    const fold = page.getByTestId('brief-toggle');
    if ((await fold.getAttribute('aria-expanded')) === 'false') await fold.click();
    await page.getByRole('tab', { name: 'I/O' }).click();
    const pane = await boxOf(page.getByTestId('dock-tabs').getByRole('tabpanel'));
    for (const table of ['table.inputs', 'table.outputs']) {
      const box = await boxOf(page.locator(table));
      expect(box.x + box.width, table).toBeLessThanOrEqual(pane.x + pane.width + 0.5);
      const clipped = await page.locator(`${table} th, ${table} td`).evaluateAll((cells) => cells.filter((c) => c.scrollWidth > c.clientWidth + 1).length);
      expect(clipped, table).toBe(0);
    }
    await page.screenshot({ path: `${SHOTS}/journey-io-1280.png` });
    await page.getByRole('tab', { name: 'Tags' }).click();
    const tagsPane = await boxOf(page.getByTestId('dock-tabs').getByRole('tabpanel'));
    const fields = await page.locator('.tags input').evaluateAll((inputs) => inputs.map((i) => i.getBoundingClientRect()).map((r) => ({ x: r.x, y: r.y, width: r.width, height: r.height })));
    expect(fields.length).toBeGreaterThan(10);
    expect(fields.filter((f) => f.x + f.width > tagsPane.x + tagsPane.width + 0.5 || f.width < 40)).toEqual([]);
    await page.screenshot({ path: `${SHOTS}/journey-tags-1280.png` });
    await context.close();
  });

  for (const scheme of ['light', 'dark'] as const) {
    it(`passes axe with the e-stop latched and F1 tripped, ${scheme} scheme`, async () => {
      const context = await suite.browser.newContext({ viewport: LAPTOP, colorScheme: scheme });
      const page = await openThreeWireLab(context);
      await foldBrief(page);
      await page.locator('[data-testid="dock-tabs"]').getByRole('button', { name: '▶ Run' }).click();
      const reset = page.getByRole('button', { name: 'Reset F1' });
      expect(await reset.getAttribute('class')).not.toMatch(/\bmain\b/);
      await page.locator('[data-device="S0"] button.mushroom').click();
      await expect.poll(() => page.getByTestId('estop-state').innerText()).toBe('LATCHED');
      await page.getByRole('button', { name: 'Trip test F1' }).click();
      await expect.poll(() => reset.getAttribute('class')).toMatch(/\bmain\b/);
      await page.screenshot({ path: `${SHOTS}/journey-latched-tripped-${scheme}.png` });
      await expectAccessible(page, `lab with the e-stop latched and F1 tripped (${scheme})`);
      await page.getByRole('tab', { name: 'I/O' }).click();
      await expectAccessible(page, `lab's I/O tab with the e-stop latched (${scheme})`);
      await context.close();
    });
  }
});
