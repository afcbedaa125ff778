/**
 * One-time tokens for invitation and password-reset links: 32 random bytes (base64url) given to
 * the person, only their SHA-256 stored. Single use, with an expiry.
 */
import { createHash, randomBytes } from 'node:crypto';

/** Password reset links live 1 hour. */
export const RESET_TOKEN_MS = 60 * 60 * 1000;
/** Invitations live 7 days: long enough to reach someone over a weekend. */
export const INVITE_TOKEN_MS = 7 * 24 * 60 * 60 * 1000;
/**
 * A link to finish a sign-up lives 24 hours: the person asked for it a moment ago, and anyone can
 * ask for one, so it stays open for less time than an invitation someone else sent.
 */
export const SIGN_UP_TOKEN_MS = 24 * 60 * 60 * 1000;

export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('base64url');
}
