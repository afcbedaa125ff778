/** express-rate-limit on the endpoints a password guesser or a mail flooder would use. */
import { rateLimit } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import { sendFailure } from './errorHandler';

/** 15 minutes: the window OWASP's authentication cheat sheet uses in its examples [memory]. */
const WINDOW_MS = 15 * 60 * 1000;

/** One limiter per endpoint family, `limit` attempts per IP per window. Its store lives in the app. */
export function authRateLimit(limit: number): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => sendFailure(res, { code: 'rate_limited', message: 'Too many attempts; wait 15 minutes and try again' }),
  });
}
