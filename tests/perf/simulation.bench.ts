/**
 * `npm run bench simulation`: the 200-rung demo program running at a 10 ms scan with the live view.
 *
 * 1. `simulation-frame-work-*` (Node): per 60 fps animation frame, the work the page does outside
 *    drawing — the paced scans on every frame and, on every VIEW_EVERY-th frame as the store does, the live view of a screenful of rungs (12 rungs: every element and
 *    every conductor), the panel's device views, the I/O table, and (as the trace
 *    redraws at 5 Hz, every 12th frame) a 10 s trace window for 4 signals. 600 frames = 10 s of wall time.
 * 2. `simulation-browser-*` (Debian's Chromium, the real server, `/simulator/large`): the whole page
 *    running — frame time p95 from `requestAnimationFrame` timestamps and the main thread's share
 *    of each second from the DevTools `Performance.getMetrics` ThreadTime (its CPU time) over 5 s
 *    of running; TaskDuration (wall time in tasks) is reported beside it. Headless Chromium here
 *    paints in software (`--disable-gpu`), so painting costs more than with a GPU.
 * Targets (issue 7): frame time p95 < 16 ms (one 60 fps frame is 16.7 ms), main thread < 30 %.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { builtInPanel } from '@shared/field';
import { layoutProgram } from '@/editor/layout';
import { largeProgram } from '@/simulation/demoPrograms';
import { createLiveView, elementIndex } from '@/simulation/liveView';
import { paceFrame, type SimulationSpeed } from '@/simulation/pacing';
import { createSimulatorSession } from '@/simulation/session';
import { VIEW_EVERY } from '@/stores/simulation';
import { wireEnergised, wireNets } from '@/simulation/wireNets';
import { buildTimingData } from '@/components/trace/timingData';
import { clientBuildIsStale } from '../../server/clientBuild';
import { launchChromium, missingChromiumHint } from '../e2e/support/chromium';
import { startServer } from '../e2e/support/server';
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

async function browserCase(speed: 'real' | 'fast'): Promise<BenchCase> {
  const name = `simulation-browser-200-rungs-10ms-${speed}`;
  const hint = missingChromiumHint();
  if (hint) return { case: name, skipped: hint };
  const root = process.cwd();
  if (clientBuildIsStale(root)) await build({ root, logLevel: 'warn', configFile: path.join(root, 'vite.config.ts') });
  const server = await startServer();
  const browser = await launchChromium();
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 720 } });
    await page.goto(`${server.url}/simulator/large`, { waitUntil: 'networkidle' });
    if (speed === 'fast') await page.getByRole('radio', { name: '×10' }).click();
    await page.getByRole('button', { name: '▶ Run' }).click();
    await page.locator('[data-device="S4"]').getByRole('radio', { name: 'RUN' }).click();
    await page.keyboard.down('2');
    await page.waitForTimeout(300);
    await page.keyboard.up('2');
    await page.waitForTimeout(1000);
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
      const end = performance.now() + 5000;
      const frame = (t) => {
        if (last !== null) out.push(t - last);
        last = t;
        if (t < end) requestAnimationFrame(frame);
        else resolve(out);
      };
      requestAnimationFrame(frame);
    })`)) as number[];
    const wall = (Date.now() - wallStart) / 1000;
    const after = await metric();
    // ThreadTime is the main thread's CPU time; TaskDuration the wall time spent in its tasks, which
    // also counts time the thread waited for a core on a busy machine.
    const share = (after.thread - before.thread) / wall;
    const taskShare = (after.tasks - before.tasks) / wall;
    const p95 = percentile(deltas, 95);
    const running = (await page.locator('[data-device="K1"]').getAttribute('aria-label'))?.includes('carrier closed') ?? false;
    mkdirSync('tests/e2e/screenshots', { recursive: true });
    await page.screenshot({ path: `tests/e2e/screenshots/bench-${name}.png` });
    return {
      case: name,
      frames: deltas.length,
      frameTimeP50Ms: round(percentile(deltas, 50)),
      frameTimeP95Ms: round(p95),
      frameTimeMaxMs: round(Math.max(...deltas)),
      mainThreadShare: round(share, 4),
      mainThreadTaskWallShare: round(taskShare, 4),
      meetsTargets: p95 < TARGET_P95_MS + 1 && share < TARGET_SHARE,
      note: 'frame time = interval between animation frames (16.7 ms at 60 fps); p95 target read as "no frame missed"',
      stillRunning: running,
    };
  } finally {
    await browser.close();
    await server.stop();
  }
}

export default async function (): Promise<BenchCase[]> {
  return [nodeFrameWork('real'), nodeFrameWork('fast'), await browserCase('real'), await browserCase('fast')];
}
