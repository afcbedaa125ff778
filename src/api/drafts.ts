/**
 * The draft of the program being edited: the editor's document kept on the server a few seconds
 * after the last edit (`shared/api/drafts.ts`). Built on the app's `Http` like the other clients,
 * so a 401 sends the user to sign-in; `sendOnLeave` is the one call that does not wait for an
 * answer (the page is going away).
 */
import { DraftResponseSchema, type SaveDraftRequest } from '@shared/api/drafts';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';
import { putOnLeave } from './sendOnLeave';

const enc = encodeURIComponent;
export const DRAFT_ENDPOINT = (programId: string) => `/api/programs/${enc(programId)}/draft`;

export function createDraftsApi(http: Http, fetchImpl: typeof fetch = (input, init) => fetch(input, init)) {
  return {
    get: (programId: string) => http.json(DRAFT_ENDPOINT(programId), DraftResponseSchema).then((r) => r.draft),
    save: (programId: string, body: SaveDraftRequest) =>
      http.json(DRAFT_ENDPOINT(programId), DraftResponseSchema, { method: 'PUT', body }).then((r) => r.draft),
    discard: (programId: string) => http.raw(DRAFT_ENDPOINT(programId), { method: 'DELETE' }).then(() => undefined),
    /** The draft sent while the page is hidden or closing (`sendOnLeave.ts`; a bigger document relies on the last autosave). */
    sendOnLeave: (programId: string, body: SaveDraftRequest): void => putOnLeave(fetchImpl, DRAFT_ENDPOINT(programId), body),
  };
}

export type DraftsApi = ReturnType<typeof createDraftsApi>;

/** The app's drafts client. */
export const draftsApi = createDraftsApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);
