import { describe, expect, it, vi } from 'vitest';
import { createClassesApi } from '@/api/classes';
import { ApiFailure, createHttp } from '@/api/http';
import { createInvitationsApi } from '@/api/invitations';
import { ANA, fakeFetch } from './fakeFetch';

const CLASS_ID = '6f1c2f0e-8d1a-4b7e-9a55-2b0c3c4d5e6f';

describe('the roster calls', () => {
  it('lists students and removes one by its id under the class', async () => {
    const fetch = fakeFetch((call) =>
      call.method === 'DELETE' ? { status: 204 } : { status: 200, body: { students: [{ id: ANA.id, email: ANA.email, name: ANA.name, enrolledAt: '2026-01-05T09:00:00.000Z' }] } },
    );
    const classes = createClassesApi(createHttp({ fetchImpl: fetch.impl }));
    expect((await classes.listStudents(CLASS_ID)).map((s) => s.email)).toEqual([ANA.email]);
    await classes.removeStudent(CLASS_ID, ANA.id);
    expect(fetch.calls.map((c) => `${c.method} ${c.url}`)).toEqual([`GET /api/classes/${CLASS_ID}/students`, `DELETE /api/classes/${CLASS_ID}/students/${ANA.id}`]);
  });

  it('uploads the roster as multipart in the field "file" and answers the report', async () => {
    const report = { invited: [{ line: 2, email: 'lee.moss@larch-hollow.example', name: 'Lee Moss' }], already: [], rejected: [] };
    const fetch = fakeFetch(() => ({ status: 200, body: { report } }));
    const classes = createClassesApi(createHttp({ fetchImpl: fetch.impl }));
    const answer = await classes.uploadRoster(CLASS_ID, new File(['email,name\nlee.moss@larch-hollow.example,Lee Moss\n'], 'roster.csv', { type: 'text/csv' }));
    expect(answer).toEqual(report);
    const body = fetch.calls[0]!.body as FormData;
    expect(body).toBeInstanceOf(FormData);
    expect((body.get('file') as File).name).toBe('roster.csv');
    expect(fetch.calls[0]!.headers['Content-Type']).toBeUndefined();
  });

  it('refuses an answer that is not a roster report', async () => {
    const fetch = fakeFetch(() => ({ status: 200, body: { report: { invited: [] } } }));
    const failure = await createClassesApi(createHttp({ fetchImpl: fetch.impl }))
      .uploadRoster(CLASS_ID, new File([''], 'roster.csv'))
      .catch((e: unknown) => e);
    expect(failure).toMatchObject({ code: 'bad_response' });
  });

  it('reports a 401 as an ended session', async () => {
    const onUnauthenticated = vi.fn();
    const fetch = fakeFetch(() => ({ status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in first.' } } }));
    const classes = createClassesApi(createHttp({ fetchImpl: fetch.impl, onUnauthenticated }));
    await expect(classes.listInvitations(CLASS_ID)).rejects.toBeInstanceOf(ApiFailure);
    expect(onUnauthenticated).toHaveBeenCalledTimes(1);
  });
});

describe('the invitation calls', () => {
  it('sends the token in the body, never in the address, and does not treat a refused link as an ended session', async () => {
    const onUnauthenticated = vi.fn();
    const token = 'abcdefghijklmnopqrstuvwxyz012345';
    const fetch = fakeFetch(() => ({ status: 401, body: { error: { code: 'unauthenticated', message: 'no' } } }));
    const invitations = createInvitationsApi(createHttp({ fetchImpl: fetch.impl, onUnauthenticated }));
    await invitations.lookup(token).catch(() => undefined);
    await invitations.accept({ token, name: 'Lee Moss', password: 'long enough pass' }).catch(() => undefined);
    expect(fetch.calls.map((c) => c.url)).toEqual(['/api/auth/invitations/lookup', '/api/auth/invitations/accept']);
    await invitations.join(token).catch(() => undefined);
    expect(fetch.calls[2]).toMatchObject({ method: 'POST', url: '/api/auth/invitations/join', body: { token } });
    expect(fetch.calls.every((c) => !c.url.includes(token) && (c.body as { token: string }).token === token)).toBe(true);
    // Joining is made signed in: a 401 there is a session that ended.
    expect(onUnauthenticated).toHaveBeenCalledTimes(1);
  });

  it('answers the invitation, the signed-in user, and the instructor invitation sent', async () => {
    const view = { email: 'lee.moss@larch-hollow.example', role: 'student', name: 'Lee Moss', classId: CLASS_ID, className: 'Motor Control 1', expiresAt: '2026-03-17T09:00:00.000Z', hasAccount: false };
    const sent = { email: 'r.holt@larch-hollow.example', role: 'instructor', expiresAt: '2026-03-17T09:00:00.000Z' };
    const fetch = fakeFetch((call) => {
      if (call.url.endsWith('/lookup')) return { status: 200, body: { invitation: view } };
      if (call.url.endsWith('/accept')) return { status: 201, body: { user: ANA } };
      return { status: 201, body: { invitation: sent } };
    });
    const invitations = createInvitationsApi(createHttp({ fetchImpl: fetch.impl }));
    expect(await invitations.lookup('abcdefghijklmnopqrstuvwxyz012345')).toEqual(view);
    expect(await invitations.accept({ token: 'abcdefghijklmnopqrstuvwxyz012345', name: 'Ana', password: 'long enough pass' })).toEqual(ANA);
    expect(await invitations.inviteInstructor({ email: sent.email })).toEqual(sent);
    expect(fetch.calls[2]).toMatchObject({ method: 'POST', url: '/api/admin/instructor-invitations', body: { email: sent.email } });
  });
});
