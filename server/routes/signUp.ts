/**
 * Sign-up with a join code: `POST /api/auth/sign-up` answers 202 "check your e-mail" for every
 * address and mails after answering; the mailed link's page looks the sign-up up and finishes it.
 */
import express, { type Router } from 'express';
import { FinishSignUpRequestSchema, LinkTokenRequestSchema, SignUpRequestSchema } from '@shared/api';
import type { AppContext } from '../context';
import { addressLimit } from '../http/rateLimits';
import { afterAnswer, parse, reply } from '../http/reply';
import * as signUp from '../services/signUp';
import { answerSignedIn } from './invitations';

export function signUpRouter(ctx: AppContext): Router {
  const router = express.Router();
  const signUpLimit = addressLimit(ctx, 'signup', ctx.config.AUTH_RATE_LIMIT);

  router.post('/auth/sign-up', signUpLimit, async (req, res) => {
    const body = parse(SignUpRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    const cls = await signUp.classForJoinCode(ctx, body.value.joinCode);
    if (!cls.ok) return reply(res, cls);
    res.status(202).json({ message: signUp.SIGN_UP_ACCEPTED });
    // Only after the answer has gone: looking the address up, writing the link and mailing must not change
    // how long the answer takes, or its timing would tell whether the address has an account.
    afterAnswer(ctx.logger, 'sign-up e-mail', () => signUp.deliverSignUp(ctx, body.value, cls.value));
  });

  router.post('/auth/sign-up/lookup', signUpLimit, async (req, res) => {
    const body = parse(LinkTokenRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await signUp.lookupSignUp(ctx, body.value.token), 200, (view) => ({ signUp: view }));
  });

  router.post('/auth/sign-up/finish', signUpLimit, async (req, res) => {
    const body = parse(FinishSignUpRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    await answerSignedIn(ctx, res, await signUp.finishSignUp(ctx, body.value), 201);
  });

  return router;
}
