/**
 * The page's side of the prover's worker: one run at a time, progress as it comes, and Stop,
 * which terminates the worker at once (the search is synchronous, so no message could reach it)
 * and leaves a fresh one for the next run. The worker is made by a factory, so tests can hand in
 * a fake one.
 */
import type { ProveRequest, WarmRequest, WorkerAnswer } from './messages';

export interface ProverProgress {
  states: number;
  depth: number;
}

export type ProverOutcome =
  | { kind: 'done'; answer: Extract<WorkerAnswer, { type: 'done' }> }
  /** Stopped by the user: nothing was decided. */
  | { kind: 'stopped'; progress: ProverProgress | null }
  | { kind: 'failed'; message: string };

/** What the client needs of a Worker. */
export interface WorkerLike {
  postMessage(message: ProveRequest | WarmRequest): void;
  terminate(): void;
  onmessage: ((event: MessageEvent<WorkerAnswer>) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
}

export type WorkerFactory = () => WorkerLike;

/** The real module worker (Vite bundles `proof.worker.ts` and its imports as its own file). */
export const browserWorker: WorkerFactory = () => new Worker(new URL('./proof.worker.ts', import.meta.url), { type: 'module' }) as unknown as WorkerLike;

export function createProver(factory: WorkerFactory = browserWorker) {
  let worker: WorkerLike | null = null;
  let runId = 0;
  let pending: { id: number; resolve: (o: ProverOutcome) => void; progress: ProverProgress | null } | null = null;

  function ensure(): WorkerLike {
    if (worker) return worker;
    const w = factory();
    w.onmessage = (event) => {
      const answer = event.data;
      if (!pending || answer.runId !== pending.id) return;
      if (answer.type === 'progress') {
        pending.progress = { states: answer.states, depth: answer.depth };
        onProgress?.(pending.progress);
        return;
      }
      const done = pending;
      pending = null;
      done.resolve(answer.type === 'done' ? { kind: 'done', answer } : { kind: 'failed', message: answer.message });
    };
    w.onerror = (event) => {
      const failed = pending;
      pending = null;
      drop();
      failed?.resolve({ kind: 'failed', message: event.message || 'the prover could not start' });
    };
    worker = w;
    return w;
  }

  function drop(): void {
    worker?.terminate();
    worker = null;
  }

  let onProgress: ((p: ProverProgress) => void) | undefined;

  return {
    /** Start a run (a run still going is stopped first). */
    run(request: Omit<ProveRequest, 'type' | 'runId'>, progress?: (p: ProverProgress) => void): Promise<ProverOutcome> {
      if (pending) this.stop();
      onProgress = progress;
      runId += 1;
      const id = runId;
      return new Promise<ProverOutcome>((resolve) => {
        pending = { id, resolve, progress: null };
        ensure().postMessage({ type: 'prove', runId: id, ...request });
      });
    },
    /** Start the worker ahead of the first run, and let it run a small proof so its code is compiled. */
    warm(request: Omit<WarmRequest, 'type'>): void {
      if (worker) return;
      ensure().postMessage({ type: 'warm', ...request });
    },
    /** End the run now: the worker goes, and the run's outcome is `stopped`. */
    stop(): void {
      const stopped = pending;
      pending = null;
      drop();
      stopped?.resolve({ kind: 'stopped', progress: stopped.progress });
    },
    get running(): boolean {
      return pending !== null;
    },
    dispose(): void {
      this.stop();
    },
  };
}

export type Prover = ReturnType<typeof createProver>;
