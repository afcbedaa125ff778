/**
 * Per-address limits on the endpoints a mail flooder or an account prober would use (password
 * reset, sign-up, invitations), counted in the database (`rate_counters`) so every app process
 * sharing it counts the same requests. Sign-in has its own throttle, on failures only
 * (`auth/signInThrottle.ts`). The address is `req.ip`: the peer, or X-Forwarded-For's client
 * only when TRUST_PROXY says which proxies to believe.
 */
import type { RequestHandler } from 'express';
import type { AppContext } from '../context';
import { countAttempt } from '../db/rateCounters';
import { sendFailure } from './errorHandler';

/** 15 minutes: the window OWASP's authentication cheat sheet uses in its examples [memory]. */
export const ADDRESS_LIMIT_WINDOW_MS = 15 * 60 * 1000;

/** At most `limit` requests per address per window to the routes behind it; `family` names the counter. */
export function addressLimit(ctx: AppContext, family: string, limit: number): RequestHandler {
  return async (req, res, next) => {
    const now = ctx.clock.now();
    const counter = await countAttempt(ctx.orm, `${family}-address:${req.ip ?? 'unknown'}`, now, ADDRESS_LIMIT_WINDOW_MS);
    if (counter.count <= limit) {
      next();
      return;
    }
    const retryAfterS = Math.max(1, Math.ceil((counter.windowStart.getTime() + ADDRESS_LIMIT_WINDOW_MS - now.getTime()) / 1000));
    res.set('Retry-After', String(retryAfterS));
    sendFailure(res, { code: 'rate_limited', message: `Too many attempts from this network; wait ${Math.ceil(retryAfterS / 60)} minutes and try again` });
  };
}
