/** `/api/auth/*` and `/api/me`: sessions and password reset (sign-up and invitations: `signUp.ts`, `invitations.ts`). */
import express, { type Response, type Router } from 'express';
import { PasswordResetConfirmSchema, PasswordResetRequestSchema, SignInRequestSchema } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { clearSessionCookie, setSessionCookie, signSession } from '../auth/session';
import { currentUser, requireUser } from '../http/authenticate';
import { authRateLimit } from '../http/rateLimits';
import { parse, reply } from '../http/reply';
import { sendFailure } from '../http/errorHandler';
import * as accounts from '../services/accounts';
import { userView } from '../services/views';
import type { Outcome } from '../http/failure';

export function authRouter(ctx: AppContext): Router {
  const router = express.Router();
  const signInLimit = authRateLimit(ctx.config.AUTH_RATE_LIMIT);
  const resetLimit = authRateLimit(ctx.config.AUTH_RATE_LIMIT);

  /** Starts a session for the user and answers `{ user }`. */
  async function startSession(res: Response, outcome: Outcome<User>, status: number): Promise<void> {
    if (!outcome.ok) return sendFailure(res, outcome.failure);
    setSessionCookie(res, await signSession(outcome.value.id, ctx.sessionKey, ctx.clock.now()), ctx.config);
    res.status(status).json({ user: userView(outcome.value) });
  }

  router.post('/auth/sign-in', signInLimit, async (req, res) => {
    const body = parse(SignInRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    await startSession(res, await accounts.signIn(ctx, body.value), 200);
  });

  router.post('/auth/sign-out', (_req, res) => {
    clearSessionCookie(res, ctx.config);
    res.status(204).end();
  });

  router.get('/me', requireUser, (req, res) => {
    res.json({ user: userView(currentUser(req)) });
  });

  router.post('/auth/password-reset', resetLimit, async (req, res) => {
    const body = parse(PasswordResetRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    await accounts.requestPasswordReset(ctx, body.value.email);
    res.status(202).json({ message: accounts.RESET_ACCEPTED });
  });

  router.post('/auth/password-reset/confirm', resetLimit, async (req, res) => {
    const body = parse(PasswordResetConfirmSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await accounts.confirmPasswordReset(ctx, body.value.token, body.value.password), 204);
  });

  return router;
}
