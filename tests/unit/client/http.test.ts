import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { createApi } from '@/api/client';
import { ApiFailure, createHttp, describeFailure } from '@/api/http';
import { ANA, fakeFetch } from './fakeFetch';

describe('the HTTP client', () => {
  it('turns an error body into an ApiFailure with its code, message, status and field messages', async () => {
    const fetch = fakeFetch(() => ({
      status: 400,
      body: { error: { code: 'validation', message: 'Some fields are wrong.', fields: { email: 'not an e-mail address', 'document.rungs.0.id': 'ids must be unique' } } },
    }));
    const http = createHttp({ fetchImpl: fetch.impl });
    const failure = await http.json('/api/anything', z.unknown(), { method: 'POST', body: { email: 'x' } }).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(ApiFailure);
    expect(failure).toMatchObject({ code: 'validation', message: 'Some fields are wrong.', status: 400 });
    expect((failure as ApiFailure).fields).toEqual({ email: 'not an e-mail address', 'document.rungs.0.id': 'ids must be unique' });
    expect(describeFailure(failure)).toBe('Some fields are wrong.');
  });

  it('keeps the details of a version conflict for the conflict dialog', async () => {
    const head = { number: 3, message: 'Second page', authorId: ANA.id, createdAt: '2026-01-05T09:00:00.000Z' };
    const fetch = fakeFetch(() => ({ status: 409, body: { error: { code: 'version_conflict', message: 'Someone saved first.', details: { head } } } }));
    const api = createApi(createHttp({ fetchImpl: fetch.impl }));
    const failure = (await api.saveVersion('p1', { baseVersion: 2, document: {}, message: '' }).catch((e: unknown) => e)) as ApiFailure;
    expect(failure.code).toBe('version_conflict');
    expect(failure.status).toBe(409);
    expect(failure.details).toEqual({ head });
  });

  it('uses the shared summary when the server sends a code with an empty message', async () => {
    const fetch = fakeFetch(() => ({ status: 429, body: { error: { code: 'rate_limited', message: '' } } }));
    const failure = (await createHttp({ fetchImpl: fetch.impl }).raw('/api/x').catch((e: unknown) => e)) as ApiFailure;
    expect(failure.code).toBe('rate_limited');
    expect(failure.message).toBe('Too many attempts; wait a few minutes and try again.');
  });

  it('names the status when the error body is not the shared shape, and says so when the network is down', async () => {
    const html = fakeFetch(() => ({ status: 502, text: '<html>Bad gateway</html>' }));
    const bad = (await createHttp({ fetchImpl: html.impl }).raw('/api/x').catch((e: unknown) => e)) as ApiFailure;
    expect(bad.code).toBe('bad_response');
    expect(bad.message).toMatch(/502/);
    const down = fakeFetch(() => 'network-down');
    const offline = (await createHttp({ fetchImpl: down.impl }).raw('/api/x').catch((e: unknown) => e)) as ApiFailure;
    expect(offline).toMatchObject({ code: 'network', status: 0 });
    expect(offline.message).toMatch(/cannot be reached/);
  });

  it('refuses an answer that does not match the route schema, naming the field', async () => {
    const fetch = fakeFetch(() => ({ status: 200, body: { programs: [{ id: 7 }] } }));
    const api = createApi(createHttp({ fetchImpl: fetch.impl }));
    const failure = (await api.listPrograms().catch((e: unknown) => e)) as ApiFailure;
    expect(failure.code).toBe('bad_response');
    expect(failure.message).toMatch(/\/api\/programs/);
    expect(failure.message).toMatch(/programs\.0\.id/);
  });

  it('sends JSON with its content type and the route from the endpoint table', async () => {
    const fetch = fakeFetch(() => ({ status: 200, body: { user: ANA } }));
    const api = createApi(createHttp({ fetchImpl: fetch.impl }));
    const answer = await api.signIn({ email: ANA.email, password: 'demo-student-larch' });
    expect(answer.user.email).toBe(ANA.email);
    expect(fetch.calls).toEqual([
      { url: '/api/auth/sign-in', method: 'POST', headers: { Accept: 'application/json', 'Content-Type': 'application/json' }, body: { email: ANA.email, password: 'demo-student-larch' } },
    ]);
    await api.getProgram('a b/c').catch(() => undefined);
    expect(fetch.calls[1]!.url).toBe('/api/programs/a%20b%2Fc');
  });
});

describe('a 401 from the server', () => {
  const unauthenticated = { status: 401, body: { error: { code: 'unauthenticated', message: 'Please sign in.' } } };

  it('announces session expiry on a signed-in call and still rejects the call', async () => {
    const onUnauthenticated = vi.fn();
    const fetch = fakeFetch(() => unauthenticated);
    const api = createApi(createHttp({ fetchImpl: fetch.impl, onUnauthenticated }));
    await expect(api.listPrograms()).rejects.toMatchObject({ code: 'unauthenticated', status: 401 });
    expect(onUnauthenticated).toHaveBeenCalledTimes(1);
  });

  it('stays quiet on the sign-in form and the "who am I" check, whose 401 is an ordinary answer', async () => {
    const onUnauthenticated = vi.fn();
    const fetch = fakeFetch(() => unauthenticated);
    const api = createApi(createHttp({ fetchImpl: fetch.impl, onUnauthenticated }));
    await expect(api.signIn({ email: ANA.email, password: 'wrong-password' })).rejects.toMatchObject({ status: 401 });
    await expect(api.me()).rejects.toMatchObject({ status: 401 });
    expect(onUnauthenticated).not.toHaveBeenCalled();
  });

  it('is not reported for other failures such as 403', async () => {
    const onUnauthenticated = vi.fn();
    const fetch = fakeFetch(() => ({ status: 403, body: { error: { code: 'forbidden', message: 'Not yours.' } } }));
    await expect(createApi(createHttp({ fetchImpl: fetch.impl, onUnauthenticated })).listUsers()).rejects.toMatchObject({ code: 'forbidden' });
    expect(onUnauthenticated).not.toHaveBeenCalled();
  });
});
