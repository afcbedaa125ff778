/**
 * The prover in a module Web Worker, so the page never freezes while every behaviour of a
 * program is explored. One request at a time; progress is posted from the search's `shouldStop`
 * hook a few times a second. Stopping a run is the page's business: it terminates this worker
 * (the search is synchronous) and starts a fresh one next time.
 */
import '@/api/zodJitless';
import { prove } from '@shared/proof';
import { PROGRESS_EVERY_MS, type ProveRequest, type WarmRequest, type WorkerAnswer } from './messages';

const post = (answer: WorkerAnswer): void => (self as unknown as { postMessage(m: WorkerAnswer): void }).postMessage(answer);

self.addEventListener('message', (event: MessageEvent<ProveRequest | WarmRequest>) => {
  const request = event.data;
  if (request?.type === 'warm') {
    try {
      prove({ program: request.program, panel: request.panel, properties: request.properties, maxStates: 5000 });
    } catch {
      // Only a warm-up: a real run reports its own failure.
    }
    return;
  }
  if (request?.type !== 'prove') return;
  const { runId } = request;
  const started = performance.now();
  let lastPost = started;
  try {
    const result = prove({
      program: request.program,
      panel: request.panel,
      properties: request.properties,
      scanMs: request.scanMs,
      now: () => performance.now(),
      shouldStop: (progress) => {
        const now = performance.now();
        if (now - lastPost >= PROGRESS_EVERY_MS) {
          lastPost = now;
          post({ type: 'progress', runId, states: progress.states, depth: progress.depth });
        }
        return false;
      },
    });
    post({ type: 'done', runId, result, ms: Math.round(performance.now() - started) });
  } catch (error) {
    post({ type: 'failed', runId, message: error instanceof Error ? error.message : String(error) });
  }
});
