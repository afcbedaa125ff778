/**
 * Drafts: the editor's unsaved document kept per user on the server, offered back when newer than
 * the head, cleared by a saved version. Owner only; the document passes a save's checks.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DraftResponseSchema } from '@shared/api/drafts';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, createProgramAs, documentWithRungs, type Cast } from './helpers/fixtures';

let t: TestApp;
let cast: Cast;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
});
afterAll(() => t.close());

const owner = () => cast.studentA.cookie;
const draftOf = (id: string, cookie = owner()) => call(t, 'get', `/api/programs/${id}/draft`, cookie);
const putDraft = (id: string, body: unknown, cookie = owner()) => call(t, 'put', `/api/programs/${id}/draft`, cookie).send(body as object);

describe('a program\'s draft', () => {
  it('is none at first, then keeps the last document put, with its base version and time', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Draft me');
    const none = await draftOf(id);
    expect(none.status).toBe(200);
    expect(DraftResponseSchema.parse(none.body)).toEqual({ draft: null });

    t.clock.set(new Date('2026-09-01T14:02:00.000Z'));
    expect((await putDraft(id, { baseVersion: 1, document: documentWithRungs(2, 'Draft me') })).status).toBe(200);
    t.clock.set(new Date('2026-09-01T14:02:05.000Z'));
    const put = await putDraft(id, { baseVersion: 1, document: documentWithRungs(3, 'Draft me') });
    expect(put.status).toBe(200);

    const got = DraftResponseSchema.parse((await draftOf(id)).body);
    expect(got.draft).toEqual({ programId: id, baseVersion: 1, document: documentWithRungs(3, 'Draft me'), updatedAt: '2026-09-01T14:02:05.000Z' });
    // A draft is never a version: the head is still version 1.
    expect((await call(t, 'get', `/api/programs/${id}`, owner())).body.program.headVersion).toBe(1);
  });

  it('is cleared when a version is saved, and by DELETE', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Saved draft');
    await putDraft(id, { baseVersion: 1, document: documentWithRungs(2) });
    const saved = await call(t, 'post', `/api/programs/${id}/versions`, owner()).send({ baseVersion: 1, document: documentWithRungs(2) });
    expect(saved.status).toBe(201);
    expect((await draftOf(id)).body).toEqual({ draft: null });

    await putDraft(id, { baseVersion: 2, document: documentWithRungs(4) });
    expect((await draftOf(id)).body.draft.baseVersion).toBe(2);
    expect((await call(t, 'delete', `/api/programs/${id}/draft`, owner())).status).toBe(204);
    expect((await draftOf(id)).body).toEqual({ draft: null });
    // Discarding what is not there is not an error.
    expect((await call(t, 'delete', `/api/programs/${id}/draft`, owner())).status).toBe(204);
  });

  it('is cleared for each of several saves that arrive together, and only for the programs saved', async () => {
    const ids = await Promise.all(['Together 1', 'Together 2', 'Left alone'].map((title) => createProgramAs(t, cast.studentA, title)));
    for (const id of ids) await putDraft(id, { baseVersion: 1, document: documentWithRungs(3) });
    // Sent at once, so the server's group commit takes them in one statement (server/db/versionBatches.ts).
    const saves = await Promise.all(ids.slice(0, 2).map((id) => call(t, 'post', `/api/programs/${id}/versions`, owner()).send({ baseVersion: 1, document: documentWithRungs(3) })));
    expect(saves.map((r) => r.status)).toEqual([201, 201]);
    expect((await draftOf(ids[0]!)).body).toEqual({ draft: null });
    expect((await draftOf(ids[1]!)).body).toEqual({ draft: null });
    expect((await draftOf(ids[2]!)).body.draft.baseVersion).toBe(1);
  });

  it('is not cleared by a save that was refused (a conflict)', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Conflicted');
    await call(t, 'post', `/api/programs/${id}/versions`, owner()).send({ baseVersion: 1, document: documentWithRungs(2) });
    await putDraft(id, { baseVersion: 1, document: documentWithRungs(5) });
    const refused = await call(t, 'post', `/api/programs/${id}/versions`, owner()).send({ baseVersion: 1, document: documentWithRungs(5) });
    expect(refused.status).toBe(409);
    expect((await draftOf(id)).body.draft.document).toEqual(documentWithRungs(5));
  });

  it('keeps each user\'s draft apart: the instructor and an admin neither see nor write the student\'s', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Private draft');
    await putDraft(id, { baseVersion: 1, document: documentWithRungs(2) });
    for (const other of [cast.instructor, cast.admin, cast.studentB]) {
      expect((await draftOf(id, other.cookie)).status).toBe(404);
      expect((await putDraft(id, { baseVersion: 1, document: documentWithRungs(1) }, other.cookie)).status).toBe(404);
    }
    expect((await draftOf(id)).body.draft.document).toEqual(documentWithRungs(2));
  });

  it('refuses a document that fails the shared schema with 422 and the located problem, keeping the previous draft', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Bad draft');
    await putDraft(id, { baseVersion: 1, document: documentWithRungs(2) });
    const bad = documentWithRungs(1) as { rungs: { network: { items: unknown[] } }[] };
    bad.rungs[0]!.network.items[0] = { kind: 'lamp', id: 'x' };
    const res = await putDraft(id, { baseVersion: 1, document: bad });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_document');
    expect(res.body.error.message).toMatch(/rungs\[0\]\.network\.items\[0\]: unknown element kind "lamp"/);
    expect((await draftOf(id)).body.draft.document).toEqual(documentWithRungs(2));
  });

  it('refuses a missing document or base version (400, field named) and a base version the program does not have', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Fields');
    const noDoc = await putDraft(id, { baseVersion: 1 });
    expect(noDoc.status).toBe(400);
    expect(noDoc.body.error.fields).toHaveProperty('document');
    const noBase = await putDraft(id, { document: documentWithRungs(1) });
    expect(noBase.status).toBe(400);
    expect(noBase.body.error.fields).toHaveProperty('baseVersion');
    const future = await putDraft(id, { baseVersion: 7, document: documentWithRungs(1) });
    expect(future.status).toBe(400);
    expect(future.body.error.fields).toHaveProperty('baseVersion');
  });

  it('refuses a body over the 1 MB limit of a save with 413', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Huge');
    const huge = { ...documentWithRungs(1), description: 'x'.repeat(1024 * 1024 + 10) };
    const draft = await putDraft(id, { baseVersion: 1, document: huge });
    const save = await call(t, 'post', `/api/programs/${id}/versions`, owner()).send({ baseVersion: 1, document: huge });
    expect([draft.status, save.status]).toEqual([413, 413]);
    expect(draft.body.error.code).toBe('payload_too_large');
  });

  it('answers 404 for a program that is not there, and 401 when not signed in', async () => {
    expect((await draftOf('00000000-0000-4000-8000-000000000000')).status).toBe(404);
    expect((await draftOf('not-a-uuid')).status).toBe(404);
    const id = await createProgramAs(t, cast.studentA, 'Anonymous');
    expect((await call(t, 'get', `/api/programs/${id}/draft`)).status).toBe(401);
  });

  it('goes with its program when the program is deleted', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Deleted');
    await putDraft(id, { baseVersion: 1, document: documentWithRungs(2) });
    expect((await call(t, 'delete', `/api/programs/${id}`, owner())).status).toBe(204);
    expect((await draftOf(id)).status).toBe(404);
  });
});
