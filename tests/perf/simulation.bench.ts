/**
 * `npm run bench simulation`: the 200-rung demo program running at a 10 ms scan with the live view.
 *
 * 1. `simulation-frame-work-*` (Node): per 60 fps animation frame, the work the page does outside
 *    drawing — the paced scans on every frame and, on every VIEW_EVERY-th frame as the store does,
 *    the live view of a screenful of rungs (12 rungs: every element and every conductor), the
 *    panel's device views, the I/O table, and (as the trace redraws at 5 Hz, every 12th frame) a
 *    10 s trace window for 4 signals. 600 frames = 10 s of wall time.
 * 2. `simulation-workbench-*` (Debian's Chromium headless shell, see `benchBrowser.ts`; the real
 *    server; a fresh production build): the workbench itself, which is
 *    what issue 7 names — `/programs/:id` with the 200-rung program created through the API by a
 *    demo student, Run pressed in its simulation dock, S4 at RUN, S2 held until K1 closes — so the
 *    figures include everything a student has on screen (palette, canvas with the live layer,
 *    panel, I/O table, event log, trace, messages). The simulator page draws its rungs with the
 *    same canvas and store, and carries less. The safety caution is dismissed first, as a student
 *    does once (it is remembered), so the canvas shows the rungs rather than the caution.
 *    - `*-60hz`: the display's 60 Hz cap on, the real condition. The main thread's share of each
 *      second is its CPU time (DevTools `Performance.getMetrics` ThreadTime) over 5 s of running;
 *      TaskDuration (wall time in its tasks, which also counts waiting for a core on a busy
 *      machine) is reported beside it, and the frame interval to show whether frames were missed.
 *    - `*-uncapped`: the frame-rate cap off (`--disable-frame-rate-limit --disable-gpu-vsync`, as
 *      the editor bench scrolls) and a pixel changed on every frame (see `sample`), so the interval
 *      between animation frames is what a frame costs, not the 16.7 ms of a 60 Hz display. Frames
 *      then come faster than 60 Hz, so each runs fewer scans (the pacing follows wall time) and the
 *      views refresh on every VIEW_EVERY-th of them; the p95 is taken over all frames, and with one
 *      frame in VIEW_EVERY refreshing it is a refresh frame's cost.
 *    Headless Chromium here paints in software (`--disable-gpu`), so painting costs more than with
 *    a GPU; a DevTools trace of the run also shows Blink keeping its accessibility tree up to date
 *    on every changed frame, as it does for a screen reader.
 * Targets (issue 7): frame time p95 < 16 ms, main thread < 30 %.
 */
import { mkdirSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { builtInPanel } from '@shared/field';
import { layoutProgram } from '@/editor/layout';
import { largeProgram } from '@/simulation/demoPrograms';
import { createLiveView, elementIndex } from '@/simulation/liveView';
import { paceFrame, type SimulationSpeed } from '@/simulation/pacing';
import { createSimulatorSession } from '@/simulation/session';
import { VIEW_EVERY } from '@/stores/simulation';
import { wireEnergised, wireNets } from '@/simulation/wireNets';
import { buildTimingData } from '@/components/trace/timingData';
import { DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { missingChromiumHint } from '../e2e/support/chromium';
import { startServer } from '../e2e/support/server';
import { buildClientForBench, launchBenchBrowser } from './benchBrowser';
import type { BenchCase } from './run';
import { percentile, round } from './stats';

const FRAME_MS = 1000 / 60;
const TARGET_P95_MS = 16;
const TARGET_SHARE = 0.3;

function nodeFrameWork(speed: SimulationSpeed): BenchCase {
  const program = largeProgram(200);
  const session = createSimulatorSession({ program, panel: builtInPanel('reversing-conveyor')!, scanMs: 10 });
  const sim = session.simulation!;
  sim.set('S4', 'RUN');
  sim.press('S2');
  session.setExtraSignals(['T13.ET']);
  const layout = layoutProgram(program);
  const elements = elementIndex(program);
  const screen = layout.rungs.slice(0, 12);
  const nets = screen.map((r) => wireNets(r.wires));
  const signals = ['%IX1', '%IX2', '%QX1', 'T13.ET'];
  const frames: number[] = [];
  let carryMs = 0;
  let checksum = 0;
  for (let frame = 0; frame < 600 + 60; frame += 1) {
    const t0 = performance.now();
    const paced = paceFrame({ carryMs, elapsedMs: FRAME_MS, speed, scanMs: session.scanMs });
    carryMs = paced.carryMs;
    session.advance(paced.scans);
    if (frame === 30) sim.release('S2');
    // The store refreshes the views on every VIEW_EVERY-th frame; the scans run on every frame.
    if (frame % VIEW_EVERY !== 0) {
      if (frame >= 60) frames.push(performance.now() - t0);
      continue;
    }
    const view = createLiveView(sim.runtime, elements);
    screen.forEach((rung, k) => {
      for (const box of rung.elements) checksum += view.get(box.id)?.right ? 1 : 0;
      const side = (id: string, s: 'in' | 'out') => (s === 'in' ? view.get(id)?.left : view.get(id)?.right) === true;
      for (let i = 0; i < rung.wires.length; i += 1) checksum += wireEnergised(rung.wires, nets[k]!, i, side, () => true) ? 1 : 0;
    });
    checksum += sim.devices().length + sim.explain().outputs.length;
    if (frame % 12 === 0) {
      const end = sim.timeMs;
      checksum += buildTimingData(session.trace.window(signals, end - 10_000, end), signals).lanes.length;
    }
    const spent = performance.now() - t0;
    if (frame >= 60) frames.push(spent); // the first second warms the JIT up
  }
  const total = frames.reduce((a, b) => a + b, 0);
  const p95 = percentile(frames, 95);
  const share = total / (frames.length * FRAME_MS);
  return {
    case: `simulation-frame-work-200-rungs-10ms-${speed}`,
    frames: frames.length,
    scansPerFrame: round((FRAME_MS * (speed === 'fast' ? 10 : speed === 'slow' ? 0.1 : 1)) / 10, 2),
    frameWorkP50Ms: round(percentile(frames, 50)),
    frameWorkP95Ms: round(p95),
    frameWorkMaxMs: round(Math.max(...frames)),
    mainThreadShare: round(share, 4),
    meetsTargets: p95 < TARGET_P95_MS && share < TARGET_SHARE,
    stillRunning: sim.word('K1') === 'closed',
    checksum,
  };
}

const UNCAPPED_FRAMES = ['--disable-frame-rate-limit', '--disable-gpu-vsync'];
const SAMPLE_MS = 5000;

/** Sign in as the first demo student and create the 200-rung program; its id. */
async function openWorkbenchProgram(page: Page, url: string): Promise<string> {
  const student = DEMO_STUDENTS[0]!;
  await page.goto(`${url}/sign-in`, { waitUntil: 'networkidle' });
  await page.getByLabel('E-mail').fill(student.email);
  await page.getByLabel('Password').fill(student.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/programs$/);
  const doc = largeProgram(200);
  return page.evaluate(async (program) => {
    const res = await fetch('/api/programs', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ title: program.title, document: program }) });
    if (!res.ok) throw new Error(`create answered ${res.status}: ${await res.text()}`);
    return ((await res.json()) as { program: { id: string } }).program.id;
  }, doc);
}

const k1Closed = async (page: Page) => /carrier closed/.test((await page.locator('[data-device="K1"]').getAttribute('aria-label')) ?? '');

/** The workbench with the program running at `speed`, the belt started forward. */
async function startRunning(page: Page, url: string, programId: string, speed: 'real' | 'fast'): Promise<void> {
  await page.goto(`${url}/programs/${programId}`, { waitUntil: 'networkidle' });
  const caution = page.locator('[data-testid="safety-caution"] .n-base-close');
  if (await caution.isVisible()) await caution.click();
  const dock = page.locator('.simulation-dock');
  await dock.getByRole('button', { name: '▶ Run' }).waitFor();
  if (speed === 'fast') await dock.getByRole('radio', { name: '×10' }).click();
  await dock.getByRole('button', { name: '▶ Run' }).click();
  await page.locator('[data-device="S4"]').getByRole('radio', { name: 'RUN' }).click();
  const cap = page.locator('[data-device="S2"] button.cap');
  await cap.scrollIntoViewIfNeeded();
  const box = (await cap.boundingBox())!;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.mouse.down();
  for (let i = 0; i < 50 && !(await k1Closed(page)); i += 1) await page.waitForTimeout(100);
  await page.mouse.up();
  await page.mouse.move(5, 5);
  if (!(await k1Closed(page))) throw new Error('K1 did not close while S2 was held on the workbench');
  // The turning motor and the overload's thermal bar in view, as a student watching the belt has them.
  await page.locator('[data-device="M1"]').scrollIntoViewIfNeeded();
  await page.waitForTimeout(1000);
}

/**
 * Intervals between animation frames over SAMPLE_MS, and the main thread's CPU and task time
 * meanwhile. With `damage`, every frame also changes one pixel-sized box: with the frame-rate cap
 * off, Chromium still paces frames that change nothing at about 60 Hz (measured: a blank page's
 * animation frames come at 58 Hz, at about 1 000 Hz once each frame changes its text), so without
 * it the two frames in three between view refreshes would be timed at the display rate.
 */
async function sample(page: Page, damage: boolean): Promise<{ deltas: number[]; share: number; taskShare: number }> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Performance.enable');
  const metric = async (): Promise<{ thread: number; tasks: number }> => {
    const { metrics } = (await cdp.send('Performance.getMetrics')) as { metrics: { name: string; value: number }[] };
    const value = (name: string) => metrics.find((m) => m.name === name)?.value ?? Number.NaN;
    return { thread: value('ThreadTime'), tasks: value('TaskDuration') };
  };
  const before = await metric();
  const wallStart = Date.now();
  // Passed as text: tsx would wrap a function literal in helpers the page does not have.
  const deltas = (await page.evaluate(`new Promise((resolve) => {
    const out = [];
    let last = null;
    const end = performance.now() + ${SAMPLE_MS};
    const dot = ${damage} ? document.body.appendChild(document.createElement('div')) : null;
    if (dot) dot.style.cssText = 'position:fixed;left:0;bottom:0;width:1px;height:1px;pointer-events:none';
    const frame = (t) => {
      if (last !== null) out.push(t - last);
      last = t;
      if (dot) dot.style.background = out.length % 2 ? '#f6f1e7' : '#f5f0e6';
      if (t < end) requestAnimationFrame(frame);
      else {
        dot?.remove();
        resolve(out);
      }
    };
    requestAnimationFrame(frame);
  })`)) as number[];
  const wall = (Date.now() - wallStart) / 1000;
  const after = await metric();
  await cdp.detach();
  return { deltas, share: (after.thread - before.thread) / wall, taskShare: (after.tasks - before.tasks) / wall };
}

async function workbenchCases(): Promise<BenchCase[]> {
  const names = (['60hz', 'uncapped'] as const).flatMap((cap) => (['real', 'fast'] as const).map((speed) => `simulation-workbench-200-rungs-10ms-${speed}-${cap}`));
  const hint = missingChromiumHint();
  if (hint) return names.map((name) => ({ case: name, skipped: hint }));
  await buildClientForBench();
  const server = await startServer({ LOG_LEVEL: 'warn' });
  const cases: BenchCase[] = [];
  mkdirSync('tests/e2e/screenshots', { recursive: true });
  try {
    for (const cap of ['60hz', 'uncapped'] as const) {
      const { browser, name: browserName } = await launchBenchBrowser(cap === 'uncapped' ? UNCAPPED_FRAMES : []);
      try {
        const page = await browser.newPage({ viewport: { width: 1280, height: 720 } });
        const programId = await openWorkbenchProgram(page, server.url).catch((err: unknown) => {
          throw new Error(`could not open the workbench (${String(err)}); server output:\n${server.output()}`);
        });
        for (const speed of ['real', 'fast'] as const) {
          const name = `simulation-workbench-200-rungs-10ms-${speed}-${cap}`;
          await startRunning(page, server.url, programId, speed);
          const { deltas, share, taskShare } = await sample(page, cap === 'uncapped');
          const stillRunning = await k1Closed(page);
          await page.screenshot({ path: `tests/e2e/screenshots/bench-${name}.png` });
          const p95 = percentile(deltas, 95);
          if (cap === '60hz') {
            cases.push({
              case: name,
              frames: deltas.length,
              mainThreadShare: round(share, 4),
              mainThreadTaskWallShare: round(taskShare, 4),
              frameIntervalP95Ms: round(p95),
              frameIntervalMaxMs: round(Math.max(...deltas)),
              meetsTarget: share < TARGET_SHARE,
              note: 'main-thread share at the real 60 Hz; frame cost is in the uncapped case',
              browser: browserName,
              stillRunning,
            });
          } else {
            cases.push({
              case: name,
              frames: deltas.length,
              framesPerSecond: round(deltas.length / (SAMPLE_MS / 1000), 1),
              frameCostP50Ms: round(percentile(deltas, 50)),
              frameCostP95Ms: round(p95),
              frameCostP99Ms: round(percentile(deltas, 99)),
              frameCostMaxMs: round(Math.max(...deltas)),
              meetsTarget: p95 < TARGET_P95_MS,
              note: 'frame-rate cap off: an interval is the cost of a frame, not the display refresh',
              browser: browserName,
              stillRunning,
            });
          }
        }
      } finally {
        await browser.close();
      }
    }
  } finally {
    await server.stop();
  }
  return cases;
}

export default async function (): Promise<BenchCase[]> {
  return [nodeFrameWork('real'), nodeFrameWork('fast'), ...(await workbenchCases())];
}
