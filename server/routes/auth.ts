/** `/api/auth/*` and `/api/me`: sessions and passwords (sign-up and invitations: `signUp.ts`, `invitations.ts`). */
import express, { type Response, type Router } from 'express';
import { ChangePasswordRequestSchema, PasswordResetConfirmSchema, PasswordResetRequestSchema, SignInRequestSchema } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { clearSessionCookie, setSessionCookie } from '../auth/session';
import { currentUser, requireUser } from '../http/authenticate';
import { addressLimit } from '../http/rateLimits';
import { afterAnswer, parse, reply } from '../http/reply';
import { sendFailure } from '../http/errorHandler';
import * as accounts from '../services/accounts';
import * as passwords from '../services/passwords';
import { endAllSessions, endSession, openSession, sessionToken } from '../services/sessions';
import { userView } from '../services/views';
import type { Failure, Outcome } from '../http/failure';

/** Sends a failure, with Retry-After when it is a throttle's 429. */
function sendRefusal(res: Response, failure: Failure): void {
  const details = failure.details as { retryAfterSeconds?: number } | undefined;
  if (failure.code === 'rate_limited' && details?.retryAfterSeconds) res.set('Retry-After', String(details.retryAfterSeconds));
  sendFailure(res, failure);
}

export function authRouter(ctx: AppContext): Router {
  const router = express.Router();
  const resetLimit = addressLimit(ctx, 'reset', ctx.config.AUTH_RATE_LIMIT);

  /** Opens a session for the user and answers `{ user }`. */
  async function startSession(res: Response, outcome: Outcome<User>, status: number): Promise<void> {
    if (!outcome.ok) return sendRefusal(res, outcome.failure);
    setSessionCookie(res, await openSession(ctx, outcome.value.id), ctx.config);
    res.status(status).json({ user: userView(outcome.value) });
  }

  router.post('/auth/sign-in', async (req, res) => {
    const body = parse(SignInRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    await startSession(res, await accounts.signIn(ctx, body.value, req.ip ?? 'unknown'), 200);
  });

  // Open to anyone: signing out twice, or with a session that already ended, is not an error.
  router.post('/auth/sign-out', async (req, res) => {
    if (req.sessionId) await endSession(ctx, req.sessionId);
    clearSessionCookie(res, ctx.config);
    res.status(204).end();
  });

  router.post('/auth/sign-out-everywhere', requireUser, async (req, res) => {
    await endAllSessions(ctx, currentUser(req).id);
    clearSessionCookie(res, ctx.config);
    res.status(204).end();
  });

  router.get('/me', requireUser, (req, res) => {
    res.json({ user: userView(currentUser(req)) });
  });

  router.post('/auth/password', requireUser, async (req, res) => {
    const body = parse(ChangePasswordRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    const user = currentUser(req);
    const changed = await passwords.changePassword(ctx, user, body.value);
    if (!changed.ok) return sendRefusal(res, changed.failure);
    setSessionCookie(res, await sessionToken(ctx, user.id, changed.value.sessionId), ctx.config);
    res.json({ user: userView(user) });
  });

  router.post('/auth/password-reset', resetLimit, (req, res) => {
    const body = parse(PasswordResetRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    // The answer goes first and is the same for every address; looking the address up, making
    // the link and mailing it happen afterwards, so the time taken tells nothing either.
    res.status(202).json({ message: passwords.RESET_ACCEPTED });
    afterAnswer(ctx.logger, 'password reset request', () => passwords.sendResetLinkIfAccount(ctx, body.value.email));
  });

  router.post('/auth/password-reset/confirm', resetLimit, async (req, res) => {
    const body = parse(PasswordResetConfirmSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await passwords.confirmPasswordReset(ctx, body.value.token, body.value.password), 204);
  });

  return router;
}
