/**
 * Invitations: look one up and accept it (signed out, creating the invited account), join a class
 * with one (signed in as the invited account), and invite one student to a class by hand.
 */
import express, { type Response, type Router } from 'express';
import { AcceptInvitationRequestSchema, InviteStudentRequestSchema, LinkTokenRequestSchema } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { setSessionCookie } from '../auth/session';
import { currentUser, requireUser } from '../http/authenticate';
import { addressLimit } from '../http/rateLimits';
import { parse, parseId, reply } from '../http/reply';
import { sendFailure } from '../http/errorHandler';
import type { Outcome } from '../http/failure';
import * as invitations from '../services/invitations';
import { inviteStudent } from '../services/roster';
import { userView } from '../services/views';
import { openSession } from '../services/sessions';

/**
 * Starts a session for a newly made account and answers `{ user }` (an accepted invitation, a
 * finished sign-up). Sessions are started the same way as at sign-in (`routes/auth.ts`).
 */
export async function answerSignedIn(ctx: AppContext, res: Response, outcome: Outcome<User>, status: number): Promise<void> {
  if (!outcome.ok) return sendFailure(res, outcome.failure);
  setSessionCookie(res, await openSession(ctx, outcome.value.id), ctx.config);
  res.status(status).json({ user: userView(outcome.value) });
}

export function invitationsRouter(ctx: AppContext): Router {
  const router = express.Router();
  const linkLimit = addressLimit(ctx, 'invitation', ctx.config.AUTH_RATE_LIMIT);

  router.post('/auth/invitations/lookup', linkLimit, async (req, res) => {
    const body = parse(LinkTokenRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await invitations.lookupInvitation(ctx, body.value.token), 200, (invitation) => ({ invitation }));
  });

  router.post('/auth/invitations/accept', linkLimit, async (req, res) => {
    const body = parse(AcceptInvitationRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    await answerSignedIn(ctx, res, await invitations.acceptInvitation(ctx, body.value), 201);
  });

  router.post('/auth/invitations/join', requireUser, linkLimit, async (req, res) => {
    const body = parse(LinkTokenRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await invitations.joinByInvitation(ctx, currentUser(req), body.value.token), 200, (cls) => ({ class: cls }));
  });

  router.post('/classes/:id/invitations', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    const body = parse(InviteStudentRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await inviteStudent(ctx, currentUser(req), id.value, body.value), 201, (invitation) => ({ invitation }));
  });

  return router;
}
