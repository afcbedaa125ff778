import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { SESSION_EXPIRED_EVENT } from '@/api/instance';
import { useSessionStore } from '@/stores/session';
import { ANA, fakeFetch, type Answer, type RecordedCall } from './fakeFetch';

/** The real store over the real client; only the network is scripted. */
function serve(answer: (call: RecordedCall) => Answer) {
  const fetch = fakeFetch(answer);
  vi.stubGlobal('fetch', fetch.impl);
  return fetch;
}

beforeEach(() => setActivePinia(createPinia()));
afterEach(() => vi.unstubAllGlobals());

describe('the session store', () => {
  it('takes a 401 from /api/me as "nobody signed in", and asks only once', async () => {
    const fetch = serve(() => ({ status: 401, body: { error: { code: 'unauthenticated', message: 'Please sign in.' } } }));
    const session = useSessionStore();
    expect(session.checked).toBe(false);
    expect(await session.ensure()).toBeNull();
    expect(await session.ensure()).toBeNull();
    expect(session.checked).toBe(true);
    expect(session.signedIn).toBe(false);
    expect(fetch.calls.map((c) => c.url)).toEqual(['/api/me']);
  });

  it('remembers the user /api/me gives', async () => {
    serve(() => ({ status: 200, body: { user: ANA } }));
    const session = useSessionStore();
    expect(await session.ensure()).toEqual(ANA);
    expect(session.signedIn).toBe(true);
  });

  it('passes on a server failure of /api/me other than 401, but still counts the check as done', async () => {
    serve(() => ({ status: 500, body: { error: { code: 'internal', message: 'Something went wrong on the server.' } } }));
    const session = useSessionStore();
    await expect(session.refresh()).rejects.toMatchObject({ code: 'internal' });
    expect(session.checked).toBe(true);
    expect(session.user).toBeNull();
  });

  it('signs in, and on wrong credentials stays signed out without announcing an expired session', async () => {
    const window = new EventTarget();
    vi.stubGlobal('dispatchEvent', window.dispatchEvent.bind(window));
    const expired = vi.fn();
    window.addEventListener(SESSION_EXPIRED_EVENT, expired);
    serve((call) =>
      call.body && (call.body as { password: string }).password === 'demo-student-larch'
        ? { status: 200, body: { user: ANA } }
        : { status: 401, body: { error: { code: 'bad_credentials', message: 'The e-mail or password is wrong.' } } },
    );
    const session = useSessionStore();
    await expect(session.signIn({ email: ANA.email, password: 'nope-nope-nope' })).rejects.toMatchObject({ code: 'bad_credentials' });
    expect(session.user).toBeNull();
    expect(await session.signIn({ email: ANA.email, password: 'demo-student-larch' })).toEqual(ANA);
    expect(session.signedIn).toBe(true);
    expect(expired).not.toHaveBeenCalled();
  });

  it('signs out with a bodiless POST and forgets the user once the server has ended the session', async () => {
    const fetch = serve((call) => (call.url === '/api/auth/sign-out' ? { status: 204 } : { status: 200, body: { user: ANA } }));
    const session = useSessionStore();
    await session.refresh();
    await session.signOut();
    expect(session.user).toBeNull();
    expect(session.checked).toBe(true);
    const out = fetch.calls.find((c) => c.url === '/api/auth/sign-out');
    expect(out).toMatchObject({ method: 'POST', body: undefined });
    expect(out?.headers['Content-Type']).toBeUndefined();
  });

  it('stays signed in when the server cannot be reached: the session is still open there', async () => {
    serve((call) => (call.url === '/api/auth/sign-out' ? 'network-down' : { status: 200, body: { user: ANA } }));
    const session = useSessionStore();
    await session.refresh();
    await expect(session.signOut()).rejects.toMatchObject({ code: 'network' });
    expect(session.user).toEqual(ANA);
  });

  it('stays signed in when the server fails to sign out (5xx)', async () => {
    serve((call) => (call.url === '/api/auth/sign-out' ? { status: 500, body: { error: { code: 'internal', message: 'Something went wrong on the server.' } } } : { status: 200, body: { user: ANA } }));
    const session = useSessionStore();
    await session.refresh();
    await expect(session.signOut()).rejects.toMatchObject({ code: 'internal' });
    expect(session.user).toEqual(ANA);
  });

  it('signs out everywhere and forgets the user', async () => {
    const fetch = serve((call) => (call.url === '/api/auth/sign-out-everywhere' ? { status: 204 } : { status: 200, body: { user: ANA } }));
    const session = useSessionStore();
    await session.refresh();
    await session.signOutEverywhere();
    expect(session.user).toBeNull();
    expect(fetch.calls.map((c) => `${c.method} ${c.url}`)).toEqual(['GET /api/me', 'POST /api/auth/sign-out-everywhere']);
  });

  it('forgets the user on expiry without asking the server again', async () => {
    const fetch = serve(() => ({ status: 200, body: { user: ANA } }));
    const session = useSessionStore();
    await session.ensure();
    session.expire();
    expect(session.user).toBeNull();
    expect(await session.ensure()).toBeNull();
    expect(fetch.calls).toHaveLength(1);
  });

  it('announces an expired session on window when a signed-in call gets 401', async () => {
    // Node has no window events: give the global the EventTarget a browser window is.
    const window = new EventTarget();
    vi.stubGlobal('dispatchEvent', window.dispatchEvent.bind(window));
    const expired = vi.fn();
    window.addEventListener(SESSION_EXPIRED_EVENT, expired);
    serve(() => ({ status: 401, body: { error: { code: 'unauthenticated', message: 'Please sign in.' } } }));
    const { api } = await import('@/api/instance');
    await expect(api.listPrograms()).rejects.toMatchObject({ status: 401 });
    expect(expired).toHaveBeenCalledTimes(1);
    await expect(api.me()).rejects.toMatchObject({ status: 401 });
    expect(expired).toHaveBeenCalledTimes(1);
  });
});
