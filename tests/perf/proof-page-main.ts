/**
 * The proof benchmark inside a page (see proof-page.ts): the same programs and properties as in
 * Node (proof-cases.ts), each decided by `prove` in a dedicated module worker, as the workbench's
 * Proof tab runs it, so the page's main thread stays free. Node calls `proofBench.run(key)` once per
 * proof; the page posts the program and its properties to the worker (structured clone, as the app
 * will) and answers with the worker's figures, the wall time from posting to the answer, and the
 * longest the main thread went without running a 5 ms timer meanwhile (a frozen page shows there).
 */
import type { ProveRequest, WorkerMessage } from './proof-page-protocol';
import { caseKey, proofCases } from './proof-cases';

export interface ProofRun {
  verdicts: string[];
  states: number;
  transitions: number;
  /** `prove` alone, timed inside the worker. */
  workerMs: number;
  /** From posting the request to handling the answer on the main thread. */
  wallMs: number;
  /** The longest gap between two ticks of a 5 ms interval on the main thread while it ran. */
  mainThreadMaxGapMs: number;
}

export interface ProofPageApi {
  /** Resolves once the worker has loaded its module; ms from `new Worker` to its first message. */
  ready(): Promise<number>;
  keys(): string[];
  run(key: string): Promise<ProofRun>;
}

type Pending = { resolve: (m: WorkerMessage) => void; posted: number };

export function installProofBench(reportViolation: (text: string) => void): void {
  const cases = new Map(proofCases().map((c) => [caseKey(c), c]));
  const created = performance.now();
  const worker = new Worker(new URL('./proof-page-worker.ts', import.meta.url), { type: 'module' });
  let readyMs: number | null = null;
  let onReady: (() => void) | null = null;
  const pending = new Map<number, Pending>();
  let nextId = 1;

  worker.addEventListener('message', (e: MessageEvent<WorkerMessage>) => {
    const m = e.data;
    if (m.kind === 'ready') {
      readyMs = performance.now() - created;
      onReady?.();
    } else if (m.kind === 'violation') reportViolation(m.text);
    else pending.get(m.id)?.resolve(m);
  });
  worker.addEventListener('error', (e) => reportViolation(`worker error: ${e.message}`));

  const api: ProofPageApi = {
    ready: () => new Promise((resolve) => (readyMs !== null ? resolve(readyMs) : (onReady = () => resolve(readyMs!)))),
    keys: () => [...cases.keys()],
    run(key) {
      const c = cases.get(key);
      if (c === undefined) return Promise.reject(new Error(`no proof bench case ${key}`));
      const id = nextId++;
      let last = performance.now();
      let maxGap = 0;
      const tick = setInterval(() => {
        const now = performance.now();
        maxGap = Math.max(maxGap, now - last);
        last = now;
      }, 5);
      return new Promise<ProofRun>((resolve, reject) => {
        const posted = performance.now();
        pending.set(id, {
          posted,
          resolve: (m) => {
            const wallMs = performance.now() - posted;
            clearInterval(tick);
            maxGap = Math.max(maxGap, performance.now() - last);
            pending.delete(id);
            if (m.kind === 'proved') resolve({ verdicts: m.verdicts, states: m.states, transitions: m.transitions, workerMs: m.ms, wallMs, mainThreadMaxGapMs: maxGap });
            else reject(new Error(`${key}: ${m.kind === 'failed' ? m.error : m.kind}`));
          },
        });
        const request: ProveRequest = { id, program: c.program, properties: c.properties };
        worker.postMessage(request);
      });
    },
  };
  (globalThis as unknown as { proofBench: ProofPageApi }).proofBench = api;
  document.title = 'proof bench ready';
}
