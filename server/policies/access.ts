/**
 * The answer of a policy. `hidden` means the caller must not learn the resource exists (404);
 * `forbidden` means they may know of it but not do this (403).
 */
import { failure, type Failure } from '../http/failure';

export type Access = 'allowed' | 'hidden' | 'forbidden';

/** The failure for a refused access, or null when allowed. */
export function refusal(access: Access, what: string): { ok: false; failure: Failure } | null {
  if (access === 'allowed') return null;
  if (access === 'hidden') return failure('not_found', `This ${what} does not exist or is not open to you`);
  return failure('forbidden', `You may look at this ${what} but not change it`);
}
