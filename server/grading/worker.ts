/**
 * The pool's worker thread: receives `{ id, work }` (a grading, an export or an import), answers
 * `{ id, result }`. A grading with `spin: true` loops forever; it is how the tests prove the
 * wall-clock limit, and only a pool created with `allowSpinForTests` sends it (no HTTP route can).
 */
import { parentPort, type TransferListItem } from 'node:worker_threads';
import { STANDARD_LABS } from '@shared/labs';
import { builtInPanel } from '@shared/field/panels';
import { gradeJob } from './gradeJob';
import { exportJob, importJob } from './documentJobs';
import type { WorkMessage } from './pool';

parentPort?.on('message', (message: { id: number; work: WorkMessage }) => {
  const { id, work } = message;
  if (work.kind === 'grade') {
    if (work.spin) {
      // Busy loop: the thread never yields, exactly like a runaway grading.
      for (;;) Math.sqrt(Math.random());
    }
    parentPort?.postMessage({ id, result: gradeJob(work.job) });
  } else if (work.kind === 'export') {
    const result = exportJob(work.job);
    // The file's bytes move to the main thread instead of being copied.
    const transfer: TransferListItem[] = result.ok ? [result.value.body.buffer as ArrayBuffer] : [];
    parentPort?.postMessage({ id, result }, transfer);
  } else {
    parentPort?.postMessage({ id, result: importJob(work.job) });
  }
});

// Warm the engine's hot paths (JIT) on the standard labs, so the first real gradings run at full speed.
for (let round = 0; round < 3; round += 1) {
  for (const lab of STANDARD_LABS) {
    const panel = builtInPanel(lab.panel);
    if (panel) gradeJob({ program: lab.solution, panel, script: lab.script });
  }
}

// Loaded and listening: the pool starts a job's clock only after this.
parentPort?.postMessage({ ready: true });
