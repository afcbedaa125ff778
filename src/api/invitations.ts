/**
 * The typed calls of invitations: look up an e-mailed invitation, accept it as a new account
 * (signed out), join its class as the invited account (signed in), and an admin inviting an
 * instructor. Answers are parsed with the shared schemas (`shared/api/invitations.ts`, `auth.ts`,
 * `classes.ts`). The token travels in the request body only, never in a URL. Looking up and
 * accepting are `quiet401`: they are made signed out, so a 401 there is not a session that ran out.
 */
import { z } from 'zod';
import { InvitationSentSchema, SessionResponseSchema, type InviteInstructorRequest } from '@shared/api/auth';
import { InvitationViewSchema, type AcceptInvitationRequest } from '@shared/api/invitations';
import { ClassSummarySchema } from '@shared/api/classes';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';

export const INVITATION_ENDPOINTS = {
  lookup: '/api/auth/invitations/lookup',
  accept: '/api/auth/invitations/accept',
  join: '/api/auth/invitations/join',
  inviteInstructor: '/api/admin/instructor-invitations',
} as const;

const ViewAnswer = z.object({ invitation: InvitationViewSchema });
const SentAnswer = z.object({ invitation: InvitationSentSchema });
const ClassAnswer = z.object({ class: ClassSummarySchema });

export function createInvitationsApi(http: Http) {
  return {
    lookup: (token: string) => http.json(INVITATION_ENDPOINTS.lookup, ViewAnswer, { method: 'POST', body: { token }, quiet401: true }).then((r) => r.invitation),
    /** Creates the account and starts its session; answers the signed-in user. */
    accept: (body: AcceptInvitationRequest) => http.json(INVITATION_ENDPOINTS.accept, SessionResponseSchema, { method: 'POST', body, quiet401: true }).then((r) => r.user),
    /** The signed-in account joins the invitation's class; answers the class. */
    join: (token: string) => http.json(INVITATION_ENDPOINTS.join, ClassAnswer, { method: 'POST', body: { token } }).then((r) => r.class),
    inviteInstructor: (body: InviteInstructorRequest) =>
      http.json(INVITATION_ENDPOINTS.inviteInstructor, SentAnswer, { method: 'POST', body }).then((r) => r.invitation),
  };
}

export type InvitationsApi = ReturnType<typeof createInvitationsApi>;

/** The app's invitations client. */
export const invitationsApi = createInvitationsApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);
