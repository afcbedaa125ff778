/**
 * The grading worker thread: receives `{ id, job }`, answers `{ id, outcome }`. A job message with
 * `spin: true` loops forever; it is how the tests prove the wall-clock limit, and only a pool
 * created with `allowSpinForTests` sends it (no HTTP route can).
 */
import { parentPort } from 'node:worker_threads';
import { STANDARD_LABS } from '@shared/labs';
import { builtInPanel } from '@shared/field/panels';
import { gradeJob, type GradeJob } from './gradeJob';

interface JobMessage {
  id: number;
  job: GradeJob;
  spin?: boolean;
}

parentPort?.on('message', (message: JobMessage) => {
  if (message.spin) {
    // Busy loop: the thread never yields, exactly like a runaway grading.
    for (;;) Math.sqrt(Math.random());
  }
  parentPort?.postMessage({ id: message.id, outcome: gradeJob(message.job) });
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
