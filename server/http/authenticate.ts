/**
 * Who is asking: reads the session cookie once per request, checks the token's signature (remembered
 * per token) and then reads its session row joined with the user, on every request and uncached:
 * a signed-out, revoked or expired session, or a deactivated account, is refused at once, in this
 * process and in any other sharing the database, and a changed role takes effect at once. Routes
 * then say who may call them with `requireUser` / `requireRole`; what a user may do with one
 * resource is the policies' job.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { AppContext } from '../context';
import { readSessionCookie, verifySession } from '../auth/session';
import { findSessionUser } from '../db/sessions';
import type { User } from '../db/users';
import { ApiError } from './failure';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** The signed-in user, when there is one. */
      user?: User;
      /** The id of the session row the request's token names (set together with `user`). */
      sessionId?: string;
    }
  }
}

export function authenticate(ctx: AppContext): RequestHandler {
  return async (req: Request, _res: Response, next: NextFunction) => {
    const token = readSessionCookie(req.headers.cookie);
    if (token) {
      const now = ctx.clock.now();
      const claims = await verifySession(token, ctx.sessionKey, now);
      const user = claims ? await findSessionUser(ctx.orm, claims.sessionId, claims.userId, now) : null;
      if (user && claims) {
        req.user = user;
        req.sessionId = claims.sessionId;
      }
    }
    next();
  };
}

/** The signed-in user; routes behind `requireUser` call this. */
export function currentUser(req: Request): User {
  if (!req.user) throw new ApiError({ code: 'unauthenticated', message: 'Please sign in first' });
  return req.user;
}

export const requireUser: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : new ApiError({ code: 'unauthenticated', message: 'Please sign in first' }));
};

export function requireRole(...roles: User['role'][]): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) next(new ApiError({ code: 'unauthenticated', message: 'Please sign in first' }));
    else if (!roles.includes(req.user.role)) {
      next(new ApiError({ code: 'forbidden', message: `Only ${roles.join(' or ')} accounts can do this` }));
    } else next();
  };
}
