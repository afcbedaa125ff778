/**
 * The API reads a page needs for its first render, sent the moment the app's code starts instead
 * of when the code that needs them has been evaluated and mounted: the session check used to wait
 * for the whole app to evaluate, and the workbench's program for the workbench to mount, one after
 * the other. Each answer is handed out once, to the first GET of the same path; whatever is left
 * is dropped on the first write or the first navigation away, so no later read gets a stale answer.
 */
import { ENDPOINTS } from './endpoints';

type Fetch = (input: RequestInfo | URL, init?: RequestInit) => Promise<Response>;

/** The same request `http.ts` makes for a GET, so the answer is the one it would have had. */
const READ_INIT: RequestInit = { method: 'GET', headers: { Accept: 'application/json' }, credentials: 'same-origin' };

/** The reads a page at `pathname` makes first: the session check, and the program on the workbench (`/programs/:id`). */
export function bootReadsFor(pathname: string): string[] {
  const reads: string[] = [ENDPOINTS.me];
  const workbench = /^\/programs\/([^/]+)\/?$/.exec(pathname);
  if (workbench) {
    try {
      reads.push(ENDPOINTS.program(decodeURIComponent(workbench[1]!)));
    } catch {
      // A malformed escape in the address: the page reports it itself; nothing to read ahead.
    }
  }
  return reads;
}

export interface BootReads {
  /** Send the reads for `pathname` now. */
  start(pathname: string): void;
  /**
   * A `fetch` for the API client: a GET of a path sent at boot gets that answer (once); any other
   * method drops the unclaimed answers first, since a write may change what they say.
   */
  fetch: Fetch;
  /** Forget every unclaimed answer. */
  drop(): void;
}

export function createBootReads(doFetch: Fetch): BootReads {
  const pending = new Map<string, Promise<Response>>();
  return {
    start(pathname) {
      for (const path of bootReadsFor(pathname)) {
        const answer = doFetch(path, READ_INIT);
        // An answer nobody claims must not surface as an unhandled rejection; a claimer still sees it.
        answer.catch(() => undefined);
        pending.set(path, answer);
      }
    },
    fetch(input, init) {
      if ((init?.method ?? 'GET') !== 'GET') pending.clear();
      else if (typeof input === 'string') {
        const answer = pending.get(input);
        pending.delete(input);
        if (answer) return answer;
      }
      return doFetch(input, init);
    },
    drop() {
      pending.clear();
    },
  };
}

/** The app's boot reads (started by `startBootReads.ts`, claimed through the client in `instance.ts`). */
export const bootReads = createBootReads((input, init) => fetch(input, init));
