/**
 * The proof bench's dedicated worker: `prove` off the page's main thread, as the workbench's Proof
 * tab runs it. Served under the production Content Security Policy like the page (a worker's
 * policy is its script's own response header), so a `new Function` or a refused WebAssembly
 * compile here is reported to the page as a violation. The page's classic `zod-jitless.js` does
 * not reach a worker, hence its first import.
 */
// First: zod must be jitless before any module that loads it is evaluated.
import '@/api/zodJitless';
import { REVERSING_CONVEYOR } from '@shared/field';
import { prove } from '@shared/proof';
import type { ProveRequest, WorkerMessage } from './proof-page-protocol';

const post = (message: WorkerMessage) => (self as unknown as Worker).postMessage(message);

self.addEventListener('securitypolicyviolation', (e) => {
  const event = e as SecurityPolicyViolationEvent;
  post({ kind: 'violation', text: `worker: ${event.violatedDirective} ${event.blockedURI}` });
});

self.addEventListener('message', (e: MessageEvent<ProveRequest>) => {
  const { id, program, properties } = e.data;
  try {
    const start = performance.now();
    const result = prove({ program, panel: REVERSING_CONVEYOR, properties });
    const ms = performance.now() - start;
    if (!result.ok) {
      post({ kind: 'failed', id, error: result.errors.join('; ') });
      return;
    }
    // Properties that share a search report the same count: each search counted once, as in Node.
    const searches = [...new Map(result.results.map((r) => [`${r.states}/${r.transitions}`, r])).values()];
    post({
      kind: 'proved',
      id,
      verdicts: result.results.map((r) => r.verdict),
      states: searches.reduce((sum, r) => sum + r.states, 0),
      transitions: searches.reduce((sum, r) => sum + r.transitions, 0),
      ms,
    });
  } catch (err) {
    post({ kind: 'failed', id, error: err instanceof Error ? err.message : String(err) });
  }
});

post({ kind: 'ready' });
