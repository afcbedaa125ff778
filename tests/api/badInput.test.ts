/**
 * Each kind of bad input that used to answer 500, answered instead with a 4xx that says what is
 * wrong and where (the fuzz test, `fuzz.test.ts`, looks for any other).
 */
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, createProgramAs, documentWithRungs, type Cast } from './helpers/fixtures';

let t: TestApp;
let cast: Cast;
let programId: string;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
  programId = await createProgramAs(t, cast.studentA);
});
afterAll(() => t.close());

/** A document whose first rung nests `levels` series/parallel levels below its root. */
function nestedDocument(levels: number) {
  let node: unknown = { kind: 'contact', id: 'c0', variant: 'no', operand: '%IX1' };
  for (let i = levels; i >= 1; i -= 1) node = i % 2 === 1 ? { kind: 'parallel', id: `p${i}`, branches: [node] } : { kind: 'series', id: `s${i}`, items: [node] };
  return { format: 'rungwright.program', version: 1, rungs: [{ id: 'r1', network: { kind: 'series', id: 'root', items: [node] } }] };
}

describe('documents past the size limits', () => {
  it('refuses a save nested 33 levels deep with a located 422, and stores nothing', async () => {
    const res = await call(t, 'post', `/api/programs/${programId}/versions`, cast.studentA.cookie).send({ baseVersion: 1, document: nestedDocument(32) });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_document');
    expect(res.body.error.message).toMatch(/^The program document cannot be stored: rungs\[0\]\.network\.items\[0\]\.branches\[0\]….*: branches nest more than 32 levels deep in rung 1$/);
    const [field, message] = Object.entries(res.body.error.fields as Record<string, string>)[0]!;
    expect(field).toMatch(/^document\.rungs\.0\.network\.items\.0\.branches\.0\.items\.0\./);
    expect(message).toBe('branches nest more than 32 levels deep in rung 1');
    const versions = await call(t, 'get', `/api/programs/${programId}/versions`, cast.studentA.cookie);
    expect(versions.body.versions).toHaveLength(1);
  });

  it('accepts the same program nested exactly 32 levels deep', async () => {
    const res = await call(t, 'post', `/api/programs/${programId}/versions`, cast.studentA.cookie).send({ baseVersion: 1, document: nestedDocument(31) });
    expect(res.status, res.text).toBe(201);
  });

  it('refuses a document far past the limit with the same located 422, and one as deep as the 973 levels once stored with a 400', async () => {
    const res = await call(t, 'post', '/api/programs', cast.studentA.cookie).send({ title: 'Deep', document: nestedDocument(60) });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toContain('branches nest more than 32 levels deep in rung 1');
    // 973 levels are some 1,950 levels of JSON: refused from the raw body before it is parsed.
    const deeper = await call(t, 'post', '/api/programs', cast.studentA.cookie).send({ title: 'Deep', document: nestedDocument(973) });
    expect(deeper.status).toBe(400);
    expect(deeper.body.error.message).toMatch(/more than 128 levels deep/);
  });

  it('refuses a JSON body nested past 128 levels before parsing it', async () => {
    const res = await call(t, 'post', '/api/programs', cast.studentA.cookie).set('Content-Type', 'application/json').send(`{"title":"x","document":${'['.repeat(100_000)}${']'.repeat(100_000)}}`);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/^The request body nests arrays and objects more than 128 levels deep \(at byte \d+\); nothing was read$/);
  });
});

describe('malformed requests', () => {
  it('answers a malformed %-escape in a path parameter with 400 naming the parameter, on every route', async () => {
    const res = await call(t, 'get', '/api/programs/%E0%A4%A', cast.studentA.cookie);
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual({ code: 'validation', message: 'The path parameter id ("%E0%A4%A") is not valid %-encoding', fields: { id: 'malformed %-escape' } });
    const version = await call(t, 'get', `/api/programs/${programId}/versions/%zz/export`, cast.studentA.cookie);
    expect(version.status).toBe(400);
    expect(version.body.error.fields).toEqual({ number: 'malformed %-escape' });
    // No route has a parameter there, so nothing is decoded: an unknown path.
    const unknown = await call(t, 'get', '/api/no-such-thing/%', cast.studentA.cookie);
    expect(unknown.status).toBe(404);
  });

  it('answers a body that is not valid gzip or deflate with 400, and an unknown encoding with 415', async () => {
    // fetch, not supertest: supertest turns a Buffer sent with a JSON type into JSON.
    const post = (encoding: string, body: Uint8Array) =>
      fetch(`${t.origin}/api/programs`, { method: 'POST', headers: { origin: t.origin, cookie: cast.studentA.cookie, 'content-type': 'application/json', 'content-encoding': encoding }, body: new Blob([new Uint8Array(body)]) });
    for (const encoding of ['gzip', 'deflate']) {
      const res = await post(encoding, Buffer.from('not compressed'));
      expect(res.status, encoding).toBe(400);
      expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(new RegExp(`^The request body is not valid ${encoding} data`));
    }
    expect((await post('compress', Buffer.from('{}'))).status).toBe(415);
    expect((await post('gzip', gzipSync(JSON.stringify({ title: 'Zipped' })))).status).toBe(201);
  });

  it('refuses NUL in any text field with 400 naming the field', async () => {
    const res = await call(t, 'patch', `/api/programs/${programId}`, cast.studentA.cookie).send({ title: 'a\u0000b' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ title: 'holds the NUL character (U+0000)' });
    const nested = await call(t, 'post', '/api/programs', cast.studentA.cookie).send({ title: 'x', document: { ...documentWithRungs(1), description: '\u0000' } });
    expect(nested.status).toBe(400);
    expect(nested.body.error.fields).toEqual({ 'document.description': 'holds the NUL character (U+0000)' });
    const query = await call(t, 'get', '/api/programs?ownerId=%00', cast.studentA.cookie);
    expect(query.status).toBe(400);
    expect(query.body.error.fields).toEqual({ ownerId: 'holds the NUL character (U+0000) (in the query string)' });
  });

  it('refuses whole numbers past 2^31 − 1 with 400 naming the field', async () => {
    const save = await call(t, 'post', `/api/programs/${programId}/versions`, cast.studentA.cookie).send({ baseVersion: 2 ** 31, document: documentWithRungs(1) });
    expect(save.status).toBe(400);
    expect(save.body.error.fields).toEqual({ baseVersion: 'baseVersion is at most 2147483647' });
    const restore = await call(t, 'post', `/api/programs/${programId}/restore`, cast.studentA.cookie).send({ version: 1, baseVersion: 99999999999 });
    expect(restore.status).toBe(400);
    expect(restore.body.error.fields).toHaveProperty('baseVersion');
    const diff = await call(t, 'get', `/api/programs/${programId}/diff?from=1&to=2147483648`, cast.studentA.cookie);
    expect(diff.status).toBe(400);
    expect(diff.body.error.fields).toHaveProperty('to');
    const path = await call(t, 'get', `/api/programs/${programId}/versions/2147483648`, cast.studentA.cookie);
    expect(path.status).toBe(404);
  });

  it('answers an id in a body that refers to nothing with a 4xx, never a database error', async () => {
    const res = await call(t, 'post', '/api/programs', cast.studentA.cookie).send({ title: 'For a lab', labId: '00000000-0000-4000-8000-000000000000' });
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect(res.body.error.message).toMatch(/lab/i);
  });

  it('refuses multipart without a boundary and multipart it cannot read with 400', async () => {
    const none = await call(t, 'post', '/api/programs/import', cast.studentA.cookie).set('Content-Type', 'multipart/form-data').send(Buffer.from('--x\r\n'));
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/^The multipart\/form-data Content-Type has no boundary parameter/);
    const garbage = await call(t, 'post', `/api/classes/${cast.classId}/roster`, cast.instructor.cookie).set('Content-Type', 'multipart/form-data; boundary=abc').send(Buffer.from('--abc\r\nContent-Disposition: form-data; name="file"; filename="r.csv"\r\n\r\nemail'));
    expect(garbage.status).toBe(400);
    expect(garbage.body.error.message).toMatch(/^The multipart body cannot be read: /);
  });

  it('refuses an XML upload holding NUL or a reference to it, saying where', async () => {
    const xml = '<?xml version="1.0"?>\n<project xmlns="http://www.plcopen.org/xml/tc6_0201">\u0000</project>';
    const res = await call(t, 'post', '/api/programs/import', cast.studentA.cookie).attach('file', Buffer.from(xml), { filename: 'p.xml', contentType: 'application/xml' });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toBe('The PLCopen file cannot be imported: line 2, column 54: the character U+0000 (NUL) is not allowed in XML');
    const reference = await call(t, 'post', '/api/programs/import', cast.studentA.cookie).attach('file', Buffer.from(xml.replace('\u0000', '&#0;')), { filename: 'p.xml', contentType: 'application/xml' });
    expect(reference.status).toBe(422);
    expect(reference.body.error.message).toMatch(/the character reference "&#0;" names U\+0000 \(NUL\)/);
  });
});
