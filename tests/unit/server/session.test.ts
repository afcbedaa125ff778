import { describe, expect, it } from 'vitest';
import { SignJWT } from 'jose';
import { readSessionCookie, SESSION_SECONDS, signSession, verifySession } from '../../../server/auth/session';

const key = new TextEncoder().encode('unit-session-key-0123456789abcdef');
const otherKey = new TextEncoder().encode('another-session-key-0123456789ab');
const issued = new Date('2026-09-01T08:00:00Z');
const later = (seconds: number) => new Date(issued.getTime() + seconds * 1000);
const user = (n: number) => `00000000-0000-4000-8000-00000000000${n}`;
const session = (n: number) => `10000000-0000-4000-8000-00000000000${n}`;

describe('verifySession', () => {
  it('answers the user and session of a valid token, on first sight and again from memory', async () => {
    const token = await signSession({ userId: user(1), sessionId: session(1) }, key, issued);
    expect(await verifySession(token, key, later(1))).toEqual({ userId: user(1), sessionId: session(1) });
    expect(await verifySession(token, key, later(2))).toEqual({ userId: user(1), sessionId: session(1) });
  });

  it('refuses a remembered token once it has expired (exp is not after now)', async () => {
    const token = await signSession({ userId: user(2), sessionId: session(2) }, key, issued);
    expect(await verifySession(token, key, later(SESSION_SECONDS - 1))).toMatchObject({ userId: user(2) });
    expect(await verifySession(token, key, later(SESSION_SECONDS))).toBeNull();
  });

  it('refuses a token signed with another key, even after the right key accepted it', async () => {
    const token = await signSession({ userId: user(3), sessionId: session(3) }, key, issued);
    expect(await verifySession(token, key, later(1))).toMatchObject({ userId: user(3) });
    expect(await verifySession(token, otherKey, later(1))).toBeNull();
  });

  it('refuses a token with a changed payload', async () => {
    const token = await signSession({ userId: user(4), sessionId: session(4) }, key, issued);
    const [header, , signature] = token.split('.');
    const forged = Buffer.from(JSON.stringify({ sub: user(9), sid: session(4), iss: 'rungwright', exp: 9_999_999_999 })).toString('base64url');
    expect(await verifySession(`${header}.${forged}.${signature}`, key, later(1))).toBeNull();
  });

  it('refuses a well-signed token that names no session row (issued before sessions could end)', async () => {
    const iat = Math.floor(issued.getTime() / 1000);
    const legacy = await new SignJWT({}).setProtectedHeader({ alg: 'HS256' }).setSubject(user(5)).setIssuer('rungwright').setIssuedAt(iat).setExpirationTime(iat + 60).sign(key);
    expect(await verifySession(legacy, key, later(1))).toBeNull();
  });
});

describe('readSessionCookie', () => {
  it('finds the session among other cookies and decodes it', () => {
    expect(readSessionCookie('theme=dark; rw_session=a%2Eb.c; other=1')).toBe('a.b.c');
  });

  it('takes a value with a broken %-escape as no session instead of throwing', () => {
    expect(readSessionCookie('rw_session=%E0%A4%A')).toBeNull();
    expect(readSessionCookie('rw_session=%')).toBeNull();
  });

  it('answers null without a cookie header or without the session cookie', () => {
    expect(readSessionCookie(undefined)).toBeNull();
    expect(readSessionCookie('theme=dark')).toBeNull();
  });
});
