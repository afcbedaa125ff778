import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ProgramDetailSchema, VersionListSchema } from '@shared/api';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, documentWithRungs, type Cast } from './helpers/fixtures';
import { labOf, programOf } from './helpers/classroom';

let t: TestApp;
let cast: Cast;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
});
afterAll(() => t.close());

const as = () => cast.studentA.cookie;

async function create(title = 'Conveyor', document: unknown = documentWithRungs(1, title)) {
  const res = await call(t, 'post', '/api/programs', as()).send({ title, document });
  expect(res.status).toBe(201);
  return ProgramDetailSchema.parse(res.body);
}

describe('creating and loading programs', () => {
  it('creates a program with version 1 and loads it with its head document', async () => {
    const created = await create('Three-wire');
    expect(created.program.headVersion).toBe(1);
    const res = await call(t, 'get', `/api/programs/${created.program.id}`, as());
    expect(res.status).toBe(200);
    expect(res.body.head.document).toEqual(documentWithRungs(1, 'Three-wire'));
    expect(res.body.program.ownerId).toBe(cast.studentA.user.id);
    // The answer splices in the document text the row cache keeps: the same bytes as res.json of the object.
    expect(res.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(Object.keys(res.body)).toEqual(['program', 'head']);
    expect(Object.keys(res.body.head)).toEqual(['number', 'message', 'authorId', 'createdAt', 'document']);
    expect(res.text).toBe(JSON.stringify(res.body));
    const one = await call(t, 'get', `/api/programs/${created.program.id}/versions/1`, as());
    expect(Object.keys(one.body.version)).toEqual(['number', 'message', 'authorId', 'createdAt', 'document']);
    expect(one.text).toBe(JSON.stringify({ version: res.body.head }));
  });

  it('starts an empty program when no document is given', async () => {
    const res = await call(t, 'post', '/api/programs', as()).send({ title: 'Blank' });
    expect(res.status).toBe(201);
    expect(res.body.head.document.rungs).toHaveLength(1);
  });

  it('lists only the caller\'s programs by default', async () => {
    const res = await call(t, 'get', '/api/programs', as());
    expect(res.status).toBe(200);
    expect(res.body.programs.every((p: { ownerId: string }) => p.ownerId === cast.studentA.user.id)).toBe(true);
  });

  it('lets the class instructor list a student\'s programs in the class\'s labs with ?ownerId, and nothing outside labs', async () => {
    const lab = await labOf(t, cast.classId, cast.instructor.user.id, 'Seal-in lab');
    const inLab = await programOf(t, cast.studentA, 'Seal-in try', lab.id);
    const res = await call(t, 'get', `/api/programs?ownerId=${cast.studentA.user.id}`, cast.instructor.cookie);
    expect(res.status).toBe(200);
    expect(res.body.programs.map((p: { id: string }) => p.id)).toEqual([inLab]);
    expect(res.body.programs[0].labTitle).toBe('Seal-in lab');
  });

  it('refuses a missing title naming the field (400)', async () => {
    const res = await call(t, 'post', '/api/programs', as()).send({ document: documentWithRungs(1) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('title');
  });

  it('refuses a document that fails the shared schema with 422, the located problem, and writes nothing', async () => {
    const before = (await call(t, 'get', '/api/programs', as())).body.programs.length;
    const bad = documentWithRungs(2);
    (bad.rungs[1].network.items[0] as { kind: string }).kind = 'lamp';
    const res = await call(t, 'post', '/api/programs', as()).send({ title: 'Bad', document: bad });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_document');
    expect(Object.keys(res.body.error.fields).join(' ')).toMatch(/document\.rungs\.1\.network\.items\.0/);
    expect((await call(t, 'get', '/api/programs', as())).body.programs.length).toBe(before);
  });

  it('answers 404 for an id that is not a uuid or not there', async () => {
    expect((await call(t, 'get', '/api/programs/not-a-uuid', as())).status).toBe(404);
    expect((await call(t, 'get', '/api/programs/00000000-0000-4000-8000-000000000000', as())).status).toBe(404);
  });
});

describe('saving versions', () => {
  it('saves on the head, refuses a stale base with 409 and the current head, and keeps every version', async () => {
    const { program } = await create('Saves');
    const v2 = await call(t, 'post', `/api/programs/${program.id}/versions`, as()).send({ baseVersion: 1, document: documentWithRungs(2), message: 'add rung 2' });
    expect(v2.status).toBe(201);
    expect(v2.body.version).toMatchObject({ number: 2, message: 'add rung 2' });
    // The answer splices in the document text the save stored: the same bytes as res.json of the object.
    expect(v2.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(Object.keys(v2.body.version)).toEqual(['number', 'message', 'authorId', 'createdAt', 'document']);
    expect(v2.body.version.document).toEqual(documentWithRungs(2));
    expect(v2.text).toBe(JSON.stringify(v2.body));

    const stale = await call(t, 'post', `/api/programs/${program.id}/versions`, as()).send({ baseVersion: 1, document: documentWithRungs(3) });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    expect(stale.body.error.details.head).toMatchObject({ number: 2, message: 'add rung 2' });

    const versions = VersionListSchema.parse((await call(t, 'get', `/api/programs/${program.id}/versions`, as())).body).versions;
    expect(versions.map((v) => v.number)).toEqual([2, 1]);
    const one = await call(t, 'get', `/api/programs/${program.id}/versions/1`, as());
    expect(one.body.version.document).toEqual(documentWithRungs(1, 'Saves'));
  });

  it('refuses a save without baseVersion naming the field (400)', async () => {
    const { program } = await create('No base');
    const res = await call(t, 'post', `/api/programs/${program.id}/versions`, as()).send({ document: documentWithRungs(1) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('baseVersion');
  });

  it('refuses an invalid document on save with 422 and leaves the head where it was', async () => {
    const { program } = await create('Invalid save');
    const res = await call(t, 'post', `/api/programs/${program.id}/versions`, as()).send({ baseVersion: 1, document: { format: 'something-else' } });
    expect(res.status).toBe(422);
    expect((await call(t, 'get', `/api/programs/${program.id}`, as())).body.program.headVersion).toBe(1);
  });
});

describe('diff, restore, rename, delete, export', () => {
  it('diffs two versions rung by rung', async () => {
    const { program } = await create('Diff', documentWithRungs(2));
    const next = documentWithRungs(2);
    next.rungs[0].network.items[0] = { kind: 'contact', id: 'c1', variant: 'nc', operand: '%IX2' };
    next.rungs.splice(1, 1);
    next.rungs.push(documentWithRungs(3).rungs[2]);
    await call(t, 'post', `/api/programs/${program.id}/versions`, as()).send({ baseVersion: 1, document: next });
    const res = await call(t, 'get', `/api/programs/${program.id}/diff?from=1&to=2`, as());
    expect(res.status).toBe(200);
    const kinds = Object.fromEntries(res.body.rungs.map((r: { rungId: string; kind: string }) => [r.rungId, r.kind]));
    expect(kinds).toEqual({ r1: 'changed', r2: 'removed', r3: 'added' });
    // The rungs' one-line text form from shared/ladder, not raw JSON.
    expect(res.body.rungs[0]).toMatchObject({ rungId: 'r1', before: '%IX1 -> %MX1', after: 'NOT %IX2 -> %MX1' });
  });

  it('refuses a diff without version numbers, naming the field', async () => {
    const { program } = await create('Diff 400');
    const res = await call(t, 'get', `/api/programs/${program.id}/diff?from=1`, as());
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('to');
  });

  it('restores an old version as a new version', async () => {
    const { program } = await create('Restore', documentWithRungs(1));
    await call(t, 'post', `/api/programs/${program.id}/versions`, as()).send({ baseVersion: 1, document: documentWithRungs(4) });
    const res = await call(t, 'post', `/api/programs/${program.id}/restore`, as()).send({ version: 1, baseVersion: 2 });
    expect(res.status).toBe(201);
    expect(res.body.version.number).toBe(3);
    expect(res.body.version.message).toBe('Restored version 1');
    expect(res.body.version.document).toEqual(documentWithRungs(1));
    expect(res.text).toBe(JSON.stringify(res.body));
  });

  it('renames and deletes a program', async () => {
    const { program } = await create('Old name');
    const renamed = await call(t, 'patch', `/api/programs/${program.id}`, as()).send({ title: 'New name' });
    expect(renamed.body.program.title).toBe('New name');
    expect((await call(t, 'patch', `/api/programs/${program.id}`, as()).send({ title: '' })).status).toBe(400);
    expect((await call(t, 'delete', `/api/programs/${program.id}`, as())).status).toBe(204);
    expect((await call(t, 'get', `/api/programs/${program.id}`, as())).status).toBe(404);
  });

  it('exports a version as JSON and as PLCopen XML', async () => {
    const { program } = await create('Export me');
    const json = await call(t, 'get', `/api/programs/${program.id}/versions/1/export?format=json`, as());
    expect(json.status).toBe(200);
    expect(json.headers['content-disposition']).toBe('attachment; filename="export-me-v1.json"');
    expect(JSON.parse(json.text)).toEqual(documentWithRungs(1, 'Export me'));
    const xml = await call(t, 'get', `/api/programs/${program.id}/versions/1/export?format=plcopen`, as());
    expect(xml.status).toBe(200);
    expect(xml.headers['content-type']).toMatch(/application\/xml/);
    expect(xml.text).toContain('http://www.plcopen.org/xml/tc6_0201');
    expect((await call(t, 'get', `/api/programs/${program.id}/versions/1/export?format=pdf`, as())).status).toBe(400);
  });
});
