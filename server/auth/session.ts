/**
 * Sessions: a JWT (HS256, jose) in an httpOnly, SameSite=Lax cookie, Secure outside development,
 * valid 8 h. Times come from the injected clock.
 */
import { SignJWT, jwtVerify } from 'jose';
import { webcrypto } from 'node:crypto';

type CryptoKey = webcrypto.CryptoKey;
import type { Response } from 'express';
import type { Config } from '../config';

export const SESSION_COOKIE = 'rw_session';
/** 8 hours, in seconds: a working day at the bench. */
export const SESSION_SECONDS = 8 * 60 * 60;
const ISSUER = 'rungwright';

// jose turns raw key bytes into a CryptoKey on every call (about 1.7 ms measured under load on the
// grading path); import each key once. Keyed weakly by the key bytes, so a rotated key is dropped.
const importedKeys = new WeakMap<Uint8Array, Promise<CryptoKey>>();
function hmacKey(key: Uint8Array): Promise<CryptoKey> {
  let imported = importedKeys.get(key);
  if (!imported) {
    imported = webcrypto.subtle.importKey('raw', key, { name: 'HMAC', hash: 'SHA-256' }, false, ['sign', 'verify']);
    importedKeys.set(key, imported);
  }
  return imported;
}

export async function signSession(userId: string, key: Uint8Array, now: Date): Promise<string> {
  const iat = Math.floor(now.getTime() / 1000);
  return new SignJWT({})
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(userId)
    .setIssuer(ISSUER)
    .setIssuedAt(iat)
    .setExpirationTime(iat + SESSION_SECONDS)
    .sign(await hmacKey(key));
}

/**
 * Tokens whose signature has been checked, per key: a token's bytes and the key decide its signature
 * and claims once and for all, so only the expiry is checked again on each request (the signature
 * check was the largest per-request cost after the database on a program load). Bounded; the
 * oldest entry goes first.
 */
const verifiedTokens = new WeakMap<Uint8Array, Map<string, { sub: string; exp: number }>>();
const VERIFIED_TOKENS_KEPT = 10_000;

/** The user id in a valid, unexpired token; null for anything else (never throws). */
export async function verifySession(token: string, key: Uint8Array, now: Date): Promise<string | null> {
  let verified = verifiedTokens.get(key);
  if (!verified) {
    verified = new Map();
    verifiedTokens.set(key, verified);
  }
  const nowSeconds = Math.floor(now.getTime() / 1000);
  const known = verified.get(token);
  // jose's own rule: a token is expired when exp <= now, in whole seconds.
  if (known) return known.exp > nowSeconds ? known.sub : null;
  try {
    const { payload } = await jwtVerify(token, await hmacKey(key), { issuer: ISSUER, algorithms: ['HS256'], currentDate: now });
    if (typeof payload.sub !== 'string' || typeof payload.exp !== 'number') return null;
    if (verified.size >= VERIFIED_TOKENS_KEPT) verified.delete(verified.keys().next().value as string);
    verified.set(token, { sub: payload.sub, exp: payload.exp });
    return payload.sub;
  } catch {
    return null;
  }
}

function cookieOptions(config: Config) {
  return { httpOnly: true, sameSite: 'lax' as const, secure: config.NODE_ENV !== 'development', path: '/' };
}

export function setSessionCookie(res: Response, token: string, config: Config): void {
  res.cookie(SESSION_COOKIE, token, { ...cookieOptions(config), maxAge: SESSION_SECONDS * 1000 });
}

export function clearSessionCookie(res: Response, config: Config): void {
  res.clearCookie(SESSION_COOKIE, cookieOptions(config));
}

/** The session token from a Cookie header (no cookie-parser needed for one cookie). */
export function readSessionCookie(header: string | undefined): string | null {
  if (!header) return null;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === SESSION_COOKIE) return decodeURIComponent(part.slice(eq + 1).trim());
  }
  return null;
}
