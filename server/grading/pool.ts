/**
 * A small pool of warm workers (`node:worker_threads`) for the work that walks a whole program:
 * grading, exporting a version, importing a PLCopen file. Done on the main thread, one 5,000-rung
 * export held the event loop for seconds and every other request waited. Starting a worker loads
 * the engine and the TypeScript loader, which costs far more than one grading (measured in
 * tests/perf/grading.bench.ts), so workers are started once and reused. Each job has a wall-clock
 * limit: past it the worker is terminated, the job answers with a note, and a fresh worker takes
 * its place, so a runaway job never hangs a request or the pool.
 */
import os from 'node:os';
import { Worker } from 'node:worker_threads';
import { failure, type Outcome } from '../http/failure';
import type { GradeJob, GradeOutcome } from './gradeJob';
import type { ExportedFile, ExportJob, ImportedProgram, ImportJob } from './documentJobs';

/** The wall-clock limit of one job (a grading, an export, an import), in ms (issue 8: terminated past 5 s). */
export const GRADING_TIMEOUT_MS = 5000;

export interface GradingPoolOptions {
  /** Number of workers; default: one per core but one, at least one, at most four. */
  size?: number;
  /** Wall-clock limit per job in ms; default `GRADING_TIMEOUT_MS`. */
  timeoutMs?: number;
  /** Tests only: let `grade(job, { spin: true })` make the worker loop forever. */
  allowSpinForTests?: boolean;
}

export interface GradeOptions {
  /** Tests only (needs `allowSpinForTests`): the worker spins instead of grading. */
  spin?: boolean;
}

/** Grades jobs off the main thread. */
export interface Grader {
  grade(job: GradeJob, options?: GradeOptions): Promise<GradeOutcome>;
  close(): Promise<void>;
}

/** Exports and imports program files off the main thread. */
export interface DocumentWork {
  exportProgram(job: ExportJob): Promise<Outcome<ExportedFile>>;
  importProgram(job: ImportJob): Promise<Outcome<ImportedProgram>>;
}

export interface GradingPool extends Grader, DocumentWork {
  /** Workers started so far (replacements included), for tests and the benchmark. */
  workersStarted(): number;
  /** Worker threads started and not yet exited (0 after `close()` resolves). */
  workersRunning(): number;
  /** Starts every worker now instead of on first use, and waits until they are up. */
  warm(): Promise<void>;
}

/** What the worker receives (with the task's id); `worker.ts` answers `{ id, result }`. */
export type WorkMessage = { kind: 'grade'; job: GradeJob; spin: boolean } | { kind: 'export'; job: ExportJob } | { kind: 'import'; job: ImportJob };

interface Task {
  id: number;
  work: WorkMessage;
  resolve(result: unknown): void;
  /** The answer when the job cannot finish (timed out, worker died, shutting down), from a note. */
  stopped(note: string): unknown;
}

interface Slot {
  worker: Worker;
  ready: Promise<void>;
  isReady: boolean;
  task: Task | null;
  timer: NodeJS.Timeout | null;
}

/**
 * A worker thread does not inherit the TypeScript loader of its parent (tsx, vitest), so from
 * source the worker starts at a small JavaScript entry that loads `worker.ts` through tsx's API.
 */
const WORKER_URL = import.meta.url.endsWith('.ts') ? new URL('./workerEntry.mjs', import.meta.url) : new URL('./worker.js', import.meta.url);

type Kind = WorkMessage['kind'];

/** The job's name in a note. */
const WHAT = { grade: 'Grading', export: 'Exporting', import: 'Importing' } satisfies Record<Kind, string>;

/** What a job past the wall-clock limit answers (the time in seconds). */
const TIMED_OUT = {
  grade: (s: number) => `Grading stopped after ${s} s of wall-clock time: the program or the checks take too long to run. Simplify the program and submit again.`,
  export: (s: number) => `Exporting stopped after ${s} s of wall-clock time: the program is too large to export.`,
  import: (s: number) => `Importing stopped after ${s} s of wall-clock time: the file is too large or complex to import.`,
} satisfies Record<Kind, (seconds: number) => string>;

const SHUTTING_DOWN = {
  grade: 'The grading service is shutting down; submit again in a moment',
  export: 'The server is shutting down; export again in a moment',
  import: 'The server is shutting down; import again in a moment',
} satisfies Record<Kind, string>;

export function defaultPoolSize(): number {
  return Math.max(1, Math.min(4, os.availableParallelism() - 1));
}

export function createGradingPool(options: GradingPoolOptions = {}): GradingPool {
  const size = Math.max(1, options.size ?? defaultPoolSize());
  const timeoutMs = options.timeoutMs ?? GRADING_TIMEOUT_MS;
  const slots: (Slot | null)[] = Array.from({ length: size }, () => null);
  const queue: Task[] = [];
  let nextId = 1;
  let started = 0;
  let exited = 0;
  let closed = false;
  /** Terminations of replaced workers still under way, so `close()` can wait for them. */
  const terminating = new Set<Promise<number>>();

  function finish(slot: Slot, answer: (task: Task) => unknown): void {
    if (slot.timer) clearTimeout(slot.timer);
    const task = slot.task;
    slot.task = null;
    slot.timer = null;
    task?.resolve(answer(task));
  }

  /** Drops a worker that timed out or died; the slot gets a fresh one on the next dispatch. */
  function replace(index: number, slot: Slot, note: (task: Task) => string): void {
    if (slots[index] === slot) slots[index] = null;
    finish(slot, (task) => task.stopped(note(task)));
    const done = slot.worker.terminate();
    terminating.add(done);
    void done.finally(() => terminating.delete(done));
    dispatch();
  }

  function start(index: number): Slot {
    started += 1;
    const worker = new Worker(WORKER_URL);
    // Idle workers must not keep the process alive (tests, CLI, shutdown).
    worker.unref();
    let markReady = (): void => {};
    const ready = new Promise<void>((resolve) => (markReady = resolve));
    const slot: Slot = { worker, ready, isReady: false, task: null, timer: null };
    worker.on('message', (message: { ready?: true; id?: number; result?: unknown }) => {
      if (message.ready) {
        slot.isReady = true;
        markReady();
      } else if ('result' in message && slot.task?.id === message.id) finish(slot, () => message.result);
      dispatch();
    });
    worker.on('error', (err) => replace(index, slot, (task) => `${WHAT[task.work.kind]} failed in its worker: ${err.message}`));
    worker.on('exit', () => {
      exited += 1;
      if (slots[index] === slot) replace(index, slot, (task) => `The worker stopped unexpectedly during ${WHAT[task.work.kind].toLowerCase()}; try again`);
    });
    slots[index] = slot;
    return slot;
  }

  function dispatch(): void {
    if (closed) return;
    for (let i = 0; i < slots.length && queue.length > 0; i += 1) {
      const slot = slots[i] ?? start(i);
      // A starting worker gets its job once loaded, so loading time never counts against the limit.
      if (slot.task || !slot.isReady) continue;
      const task = queue.shift()!;
      slot.task = task;
      slot.timer = setTimeout(() => replace(i, slot, (t) => TIMED_OUT[t.work.kind](timeoutMs / 1000)), timeoutMs);
      slot.worker.postMessage({ id: task.id, work: task.work });
    }
  }

  function submit<R>(work: WorkMessage, stopped: (note: string) => R): Promise<R> {
    if (closed) return Promise.resolve(stopped(SHUTTING_DOWN[work.kind]));
    return new Promise<R>((resolve) => {
      queue.push({ id: nextId++, work, resolve: resolve as (result: unknown) => void, stopped });
      dispatch();
    });
  }

  const noReport = (note: string): GradeOutcome => ({ report: null, note });
  const refused = (note: string) => failure('processing_limit', note);

  return {
    grade(job, gradeOptions = {}) {
      const spin = gradeOptions.spin === true && options.allowSpinForTests === true;
      return submit({ kind: 'grade', job, spin }, noReport);
    },
    exportProgram: (job) => submit<Outcome<ExportedFile>>({ kind: 'export', job }, refused),
    importProgram: (job) => submit<Outcome<ImportedProgram>>({ kind: 'import', job }, refused),
    workersStarted: () => started,
    workersRunning: () => started - exited,
    async warm() {
      await Promise.all(slots.map((slot, i) => (slot ?? start(i)).ready));
    },
    async close() {
      closed = true;
      const live = slots.filter((s): s is Slot => s !== null);
      slots.fill(null);
      for (const slot of live) finish(slot, (task) => task.stopped(SHUTTING_DOWN[task.work.kind]));
      for (const task of queue.splice(0)) task.resolve(task.stopped(SHUTTING_DOWN[task.work.kind]));
      // Workers replaced after a timeout are being terminated already; wait for those too.
      await Promise.all([...live.map((s) => s.worker.terminate()), ...terminating]);
    },
  };
}
