/**
 * Per-user limits on the calls that cost the server real work: exports, imports, gradings (trial
 * runs, submissions, regrades), uploads and database backups. Counted in the database (`db/rateCounters.ts`), so
 * every app process sharing it counts the same calls. Past the limit the call is answered 429 with
 * `Retry-After` (seconds) and a sentence saying how long to wait; nothing runs.
 *
 * The limits leave a class room to work (a student submits a handful of times an hour) and stop
 * one account from filling the worker pool or the database.
 */
import express, { type RequestHandler, type Router } from 'express';
import type { AppContext } from '../context';
import { countAttempt } from '../db/rateCounters';
import { sendFailure } from './errorHandler';

export type LimitedWork = 'export' | 'import' | 'grading' | 'upload' | 'backup';

export interface UserLimit {
  /** Calls allowed per window. */
  limit: number;
  windowMs: number;
  /** Plural noun for the message, e.g. "exports". */
  what: string;
}

const FIVE_MINUTES = 5 * 60 * 1000;

export const USER_LIMITS = {
  export: { limit: 30, windowMs: FIVE_MINUTES, what: 'exports' },
  import: { limit: 20, windowMs: FIVE_MINUTES, what: 'imports' },
  grading: { limit: 30, windowMs: FIVE_MINUTES, what: 'gradings (trial runs, submissions and regrades)' },
  upload: { limit: 20, windowMs: FIVE_MINUTES, what: 'uploads' },
  // A dump copies the whole database: a few a day is plenty.
  backup: { limit: 3, windowMs: FIVE_MINUTES, what: 'backups' },
} as const satisfies Record<LimitedWork, UserLimit>;

/** Which route counts against which limit. */
export const LIMITED_ROUTES: readonly { method: 'get' | 'post'; path: string; work: LimitedWork }[] = [
  { method: 'get', path: '/programs/:id/versions/:number/export', work: 'export' },
  { method: 'post', path: '/programs/import', work: 'import' },
  { method: 'post', path: '/labs/:id/try', work: 'grading' },
  { method: 'post', path: '/labs/:id/submissions', work: 'grading' },
  { method: 'post', path: '/labs/:id/regrade', work: 'grading' },
  { method: 'post', path: '/classes/:id/roster', work: 'upload' },
  { method: 'post', path: '/labs/:id/attachments', work: 'upload' },
  { method: 'get', path: '/admin/backup', work: 'backup' },
];

/** `2 min 5 s`, `40 s`. */
export function formatWait(seconds: number): string {
  const minutes = Math.floor(seconds / 60);
  const rest = seconds % 60;
  if (minutes === 0) return `${rest} s`;
  return rest === 0 ? `${minutes} min` : `${minutes} min ${rest} s`;
}

function limiter(ctx: AppContext, work: LimitedWork): RequestHandler {
  const { limit, windowMs, what } = USER_LIMITS[work];
  return async (req, res, next) => {
    // Signed-out callers are refused by the route itself (401); there is no one to count.
    if (!req.user) return next();
    const now = ctx.clock.now();
    const counter = await countAttempt(ctx.orm, `${work}:${req.user.id}`, now, windowMs);
    if (counter.count <= limit) return next();
    const waitSeconds = Math.max(1, Math.ceil((counter.windowStart.getTime() + windowMs - now.getTime()) / 1000));
    res.setHeader('Retry-After', String(waitSeconds));
    sendFailure(res, {
      code: 'rate_limited',
      message: `Too many ${what}: at most ${limit} in ${windowMs / 60_000} minutes for one account. Try again in ${formatWait(waitSeconds)}.`,
      details: { retryAfterSeconds: waitSeconds },
    });
  };
}

/** A router that counts the limited calls before their own routes run. */
export function expensiveCallLimits(ctx: AppContext): Router {
  const router = express.Router();
  for (const route of LIMITED_ROUTES) router[route.method](route.path, limiter(ctx, route.work));
  return router;
}
