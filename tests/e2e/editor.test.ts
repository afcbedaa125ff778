import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { NetworkNode, Program, Rung } from '@shared/ladder/schema';
import { layoutProgram } from '@/editor/layout';
import { DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { SHOTS, useBrowserSuite } from './support/browserSuite';

const suite = useBrowserSuite();

/** A document of the same shape as the one on screen: the test finds slots with the same layout function. */
const c = (id: string): NetworkNode => ({ kind: 'contact', id, variant: 'no', operand: 'x' });
const q = (id: string): NetworkNode => ({ kind: 'coil', id, variant: 'coil', operand: 'x' });
const shape = (rungs: NetworkNode[][]): Program => ({
  format: 'rungwright.program',
  version: 1,
  title: '',
  description: '',
  tags: [],
  rungs: rungs.map((items, i): Rung => ({ id: `r${i}`, comment: '', network: { kind: 'series', id: `s${i}`, items } })),
});

/** Screen position of a slot (rung index, path, index) for a document of this shape, at zoom 1, unscrolled. */
async function slotPoint(_page: Page, doc: Program, rung: number, path: number[], index: number) {
  const layout = layoutProgram(doc);
  const r = layout.rungs[rung]!;
  const slot = r.slots.find((s) => s.target.index === index && s.target.path.join('.') === path.join('.'));
  if (!slot) throw new Error(`no slot ${rung}/${path.join('.')}/${index}`);
  return { x: slot.x, y: r.top + slot.y };
}

async function elementPoint(_page: Page, doc: Program, id: string) {
  const layout = layoutProgram(doc);
  for (const r of layout.rungs) {
    const box = r.elements.find((b) => b.id === id);
    if (box) return { x: box.x + box.width / 2, y: r.top + box.wireY };
  }
  throw new Error(`no element ${id}`);
}

async function dragFromPalette(page: Page, item: string, target: { x: number; y: number }) {
  await page.dragAndDrop(`[data-palette="${item}"]`, '[data-testid="rung-canvas"]', { targetPosition: target });
}

async function clickCanvas(page: Page, point: { x: number; y: number }) {
  const box = (await page.getByTestId('rung-canvas').boundingBox())!;
  await page.mouse.click(box.x + point.x, box.y + point.y);
}

async function setOperand(page: Page, value: string) {
  const field = page.getByLabel('Operand', { exact: true });
  await field.fill(value);
  await field.press('Enter');
}

describe('the rung editor in a real browser', () => {
  it('draws a start/stop rung by mouse and a second rung by keyboard, validates, undoes, saves and reloads it', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1440, height: 900 } });
    const problems: string[] = [];
    page.on('pageerror', (error) => problems.push(error.message));
    const student = DEMO_STUDENTS[0]!;

    await page.goto(`${suite.server.url}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail').fill(student.email);
    await page.getByLabel('Password').fill(student.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/programs$/);

    await page.getByRole('button', { name: 'New program' }).click();
    await page.getByLabel('Program title').fill('Conveyor start/stop (e2e)');
    await page.getByRole('button', { name: 'Create', exact: true }).click();
    await page.waitForURL(/\/programs\/[^/]+$/);
    const programUrl = page.url();
    await page.getByTestId('rung-canvas').waitFor();
    await page.getByTestId('safety-caution').waitFor();
    await page.screenshot({ path: `${SHOTS}/workbench-empty.png` });
    // The panel's devices as tags (S1 = %IX1, S2 = %IX2, K1 = %QX1 …).
    await page.getByRole('tab', { name: 'Tags' }).click();
    await page.getByRole('button', { name: /Add panel devices/ }).click();
    await page.getByRole('tab', { name: 'Inspector' }).click();

    // Rung 1 by mouse: stop, start, coil, then a branch below the start button for the seal-in.
    await dragFromPalette(page, 'contact:no', await slotPoint(page, shape([[]]), 0, [], 0));
    await setOperand(page, 'S1');
    await dragFromPalette(page, 'contact:no', await slotPoint(page, shape([[c('a')]]), 0, [], 1));
    await setOperand(page, 'S2');
    await dragFromPalette(page, 'coil:coil', await slotPoint(page, shape([[c('a'), c('b')]]), 0, [], 2));
    // The coil is left without an operand: the messages drawer says so.
    await expect.poll(() => page.getByRole('region', { name: 'Messages' }).innerText()).toMatch(/no operand/);
    await page.screenshot({ path: `${SHOTS}/workbench-missing-operand.png` });
    await setOperand(page, '%QX1');
    await clickCanvas(page, await elementPoint(page, shape([[c('a'), c('b'), q('k')]]), 'b'));
    await page.getByRole('button', { name: /^Add branch below/ }).click();
    const branched = shape([[c('a'), { kind: 'parallel', id: 'p', branches: [c('b'), { kind: 'series', id: 'u', items: [] }] }, q('k')]]);
    await dragFromPalette(page, 'contact:no', await slotPoint(page, branched, 0, [1, 1], 0));
    await setOperand(page, '%QX1');

    // Rung 2 by keyboard only: a new rung, a contact, a coil, operands through Enter.
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
    await expect.poll(() => page.getByRole('region', { name: 'Messages' }).innerText()).toMatch(/No problems found/);

    // Undo the last operand (typing it was one step), then redo it.
    await page.getByTestId('rung-canvas').focus();
    await page.keyboard.press('Control+z');
    await expect.poll(() => page.getByRole('region', { name: 'Messages' }).innerText()).toMatch(/no operand/);
    await page.keyboard.press('Control+Shift+Z');
    await expect.poll(() => page.getByRole('region', { name: 'Messages' }).innerText()).toMatch(/No problems found/);
    await page.screenshot({ path: `${SHOTS}/workbench-two-rungs.png` });

    await page.keyboard.press('Control+s');
    await page.getByLabel('Version message').fill('Start/stop with seal-in, and the photo-eye lamp');
    await page.getByLabel('Version message').press('Enter');
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 2/);

    await page.reload({ waitUntil: 'networkidle' });
    await page.getByTestId('rung-canvas').waitFor();
    await expect.poll(() => page.getByTestId('save-status').innerText()).toMatch(/Saved · version 2/);
    const saved = await page.evaluate(async (url) => {
      const id = url.split('/').pop();
      return (await (await fetch(`/api/programs/${id}`)).json()) as { head: { number: number; document: Program } };
    }, programUrl);
    expect(saved.head.number).toBe(2);
    const [first, second] = saved.head.document.rungs;
    const operands = (items: NetworkNode[]): unknown =>
      items.map((n) =>
        n.kind === 'parallel' ? n.branches.map((b) => operands(b.kind === 'series' ? b.items : [b])) : n.kind === 'series' ? operands(n.items) : n.kind === 'block' ? n.type : `${n.kind}:${n.operand}`,
      );
    expect(operands(first!.network.items)).toEqual(['contact:S1', [['contact:S2'], ['contact:%QX1']], 'coil:%QX1']);
    expect(operands(second!.network.items)).toEqual(['contact:%IX5', 'coil:%QX6']);
    await page.screenshot({ path: `${SHOTS}/workbench-reloaded.png` });
    expect(problems).toEqual([]);
    await page.close();
  });
});
