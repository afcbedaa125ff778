/**
 * Throttling of password guesses, in the database so several app processes count together.
 *
 * - Per account: keyed by the e-mail as typed (lower case), so an address without an account is
 *   throttled exactly like one with, and the limit tells nobody which addresses have accounts.
 *   FREE_FAILURES failures cost nothing; then each attempt waits 30 s, doubling with every further
 *   failure up to 15 min. The count lasts 24 h from its first failure; a successful sign-in or a
 *   password reset clears it. The attempt is counted (and its back-off set) before the password is
 *   checked, so a burst sent at once gets no more tries than one sent one by one.
 * - Per address (the client's IP as Express sees it: X-Forwarded-For only under TRUST_PROXY): at
 *   most AUTH_RATE_LIMIT failed sign-ins per 15 min, against one password tried on many accounts.
 *   Only failures count, so a class signing in behind one NAT does not lock itself out. Each
 *   attempt takes a slot atomically before the password is checked and a success gives it back,
 *   so a burst sent at once gets no more failures in than the limit.
 *
 * A password change checks the current password against the same per-account counter.
 */
import type { Db } from '../db/client';
import { failure } from '../http/failure';
import { clearCounter, countAttempt, uncountAttempt } from '../db/rateCounters';
import { deleteStaleCounters, takeAttempt, type BackoffPolicy } from '../db/backoffCounters';

/** Failures per account before the first wait. */
export const FREE_FAILURES = 5;

export const ACCOUNT_POLICY: BackoffPolicy = {
  windowMs: 24 * 60 * 60 * 1000,
  free: FREE_FAILURES,
  firstBackoffMs: 30 * 1000,
  maxBackoffMs: 15 * 60 * 1000,
};

/** 15 minutes: the window OWASP's authentication cheat sheet uses in its examples [memory]. */
export const ADDRESS_WINDOW_MS = 15 * 60 * 1000;

const PREFIX = 'signin-';
export const accountKey = (email: string): string => `${PREFIX}account:${email.trim().toLowerCase()}`;
export const addressKey = (address: string): string => `${PREFIX}address:${address}`;

/** Go ahead, or wait until `retryAt` (who is throttled decides the wording). */
export type ThrottleVerdict = { allowed: true } | { allowed: false; scope: 'account' | 'address'; retryAt: Date };

/**
 * Takes a slot for one password attempt from `address`, in one atomic upsert: refused once the
 * window holds `limit` failures (and attempts in flight). A success gives the slot back
 * (`addressSucceeded`), so only failures stay counted.
 */
export async function reserveAddressAttempt(db: Db, address: string, limit: number, now: Date): Promise<ThrottleVerdict> {
  const counter = await countAttempt(db, addressKey(address), now, ADDRESS_WINDOW_MS);
  if (counter.count <= limit) return { allowed: true };
  await uncountAttempt(db, addressKey(address));
  return { allowed: false, scope: 'address', retryAt: new Date(counter.windowStart.getTime() + ADDRESS_WINDOW_MS) };
}

/** Takes one attempt at the account's password (counted now; cleared by `passwordAccepted`). */
export async function takeAccountAttempt(db: Db, email: string, now: Date): Promise<ThrottleVerdict> {
  const verdict = await takeAttempt(db, accountKey(email), now, ACCOUNT_POLICY);
  return verdict.allowed ? { allowed: true } : { allowed: false, scope: 'account', retryAt: verdict.blockedUntil };
}

/** The right password from `address`: its reserved slot is given back (only failures count). */
export async function addressSucceeded(db: Db, address: string): Promise<void> {
  await uncountAttempt(db, addressKey(address));
}

/** The right password (or a completed reset): the account's failures and any back-off go. */
export async function passwordAccepted(db: Db, email: string): Promise<void> {
  await clearCounter(db, accountKey(email));
}

/** Forgets up to 100 sign-in counters that no longer matter (older than a day, no back-off in force). */
export async function sweepSignInCounters(db: Db, now: Date): Promise<number> {
  return deleteStaleCounters(db, PREFIX, new Date(now.getTime() - ACCOUNT_POLICY.windowMs), now, 100);
}

/** "Try again in 2 minutes": the wait, rounded up, in words. */
export function waitInWords(retryAt: Date, now: Date): string {
  const seconds = Math.max(1, Math.ceil((retryAt.getTime() - now.getTime()) / 1000));
  if (seconds < 60) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}

/** The 429 for a refused attempt; `details.retryAfterSeconds` becomes the Retry-After header. */
export function throttledFailure(verdict: Extract<ThrottleVerdict, { allowed: false }>, now: Date) {
  const who = verdict.scope === 'account' ? 'for this account' : 'from this network';
  const retryAfterSeconds = Math.max(1, Math.ceil((verdict.retryAt.getTime() - now.getTime()) / 1000));
  return failure('rate_limited', `Too many failed sign-ins ${who}; try again in ${waitInWords(verdict.retryAt, now)}`, { details: { retryAfterSeconds } });
}
