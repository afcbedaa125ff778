/**
 * A program's proof sheet (its properties and the checks kept from counterexamples), stored on
 * the server beside the program (`shared/api/proof.ts`). Built on the app's `Http` like the other
 * clients, so a 401 sends the user to sign-in; `sendOnLeave` is the one call that does not wait
 * for an answer (the page is going away).
 */
import { ProofSheetResponseSchema, type ProofSheet } from '@shared/api/proof';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';
import { putOnLeave } from './sendOnLeave';

const enc = encodeURIComponent;
export const PROOF_ENDPOINT = (programId: string) => `/api/programs/${enc(programId)}/proof`;

export function createProofApi(http: Http, fetchImpl: typeof fetch = (input, init) => fetch(input, init)) {
  return {
    get: (programId: string) => http.json(PROOF_ENDPOINT(programId), ProofSheetResponseSchema),
    save: (programId: string, sheet: ProofSheet) => http.json(PROOF_ENDPOINT(programId), ProofSheetResponseSchema, { method: 'PUT', body: sheet }),
    /** The sheet sent while the page is hidden or closing (`sendOnLeave.ts`). */
    sendOnLeave: (programId: string, sheet: ProofSheet): void => putOnLeave(fetchImpl, PROOF_ENDPOINT(programId), sheet),
  };
}

export type ProofApi = ReturnType<typeof createProofApi>;

/** The app's proof-sheet client. */
export const proofApi = createProofApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);
