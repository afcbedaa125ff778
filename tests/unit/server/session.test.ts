import { describe, expect, it } from 'vitest';
import { SESSION_SECONDS, signSession, verifySession } from '../../../server/auth/session';

const key = new TextEncoder().encode('unit-session-key-0123456789abcdef');
const otherKey = new TextEncoder().encode('another-session-key-0123456789ab');
const issued = new Date('2026-09-01T08:00:00Z');
const later = (seconds: number) => new Date(issued.getTime() + seconds * 1000);

describe('verifySession', () => {
  it('answers the user of a valid token, on first sight and again from memory', async () => {
    const token = await signSession('user-1', key, issued);
    expect(await verifySession(token, key, later(1))).toBe('user-1');
    expect(await verifySession(token, key, later(2))).toBe('user-1');
  });

  it('refuses a remembered token once it has expired (exp is not after now)', async () => {
    const token = await signSession('user-2', key, issued);
    expect(await verifySession(token, key, later(SESSION_SECONDS - 1))).toBe('user-2');
    expect(await verifySession(token, key, later(SESSION_SECONDS))).toBeNull();
  });

  it('refuses a token signed with another key, even after the right key accepted it', async () => {
    const token = await signSession('user-3', key, issued);
    expect(await verifySession(token, key, later(1))).toBe('user-3');
    expect(await verifySession(token, otherKey, later(1))).toBeNull();
  });

  it('refuses a token with a changed payload', async () => {
    const token = await signSession('user-4', key, issued);
    const [header, , signature] = token.split('.');
    const forged = Buffer.from(JSON.stringify({ sub: 'admin', iss: 'rungwright', exp: 9_999_999_999 })).toString('base64url');
    expect(await verifySession(`${header}.${forged}.${signature}`, key, later(1))).toBeNull();
  });
});
