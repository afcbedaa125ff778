/** Gradebook JSON and CSV (papaparse, quoting, Content-Disposition), attachments, and grading limits. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { FORWARD_REVERSE } from '@shared/labs';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, type Cast } from './helpers/fixtures';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';

let t: TestApp;
let cast: Cast;
let labId: string;

beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
  ({ labId } = await labFromTemplate(t, cast.instructor, cast.classId, 'forward-reverse'));
  await publish(t, cast.instructor, labId);
  await call(t, 'patch', `/api/labs/${labId}`, cast.instructor.cookie).send({ title: 'Fwd/Rev, "interlocked"' });
  await submitVersion(t, cast.studentA, labId, await saveInCopy(t, cast.studentA, labId, FORWARD_REVERSE.solution));
}, 60_000);
afterAll(() => t.close());

describe('gradebook', () => {
  it('lists students × labs with final scores and totals', async () => {
    const res = await call(t, 'get', `/api/classes/${cast.classId}/gradebook`, cast.instructor.cookie);
    expect(res.status).toBe(200);
    const a = res.body.rows.find((r: { student: { id: string } }) => r.student.id === cast.studentA.user.id);
    const b = res.body.rows.find((r: { student: { id: string } }) => r.student.id === cast.studentB.user.id);
    expect(a.cells[0]).toMatchObject({ labId, finalScore: 14, status: 'graded' });
    expect(a.total).toBe(14);
    expect(b.cells[0].finalScore).toBeNull();
    expect((await call(t, 'get', `/api/classes/${cast.classId}/gradebook`, cast.studentA.cookie)).status).toBe(403);
  });

  it('exports CSV with quoting and a file name', async () => {
    const res = await call(t, 'get', `/api/classes/${cast.classId}/gradebook.csv`, cast.instructor.cookie);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?gradebook-motor-control-1-fall-2026\.csv"?$/);
    expect(res.text).toContain('"Fwd/Rev, ""interlocked"" (/14)"');
    const parsed = Papa.parse<string[]>(res.text.trim());
    // Keyed by e-mail in the first column, as grade imports match accounts; late days and penalty beside each score.
    expect(parsed.data[0]).toEqual(['Email', 'Student', 'Fwd/Rev, "interlocked" (/14)', 'Fwd/Rev, "interlocked": late days', 'Fwd/Rev, "interlocked": late penalty %', 'Total', 'Possible']);
    expect(parsed.data.find((r) => r[0] === cast.studentA.user.email)).toEqual([cast.studentA.user.email, 'student.a', '14', '0', '0', '14', '14']);
    expect(parsed.data.find((r) => r[0] === cast.studentB.user.email)).toEqual([cast.studentB.user.email, 'student.b', '', '', '', '0', '14']);
  });
});

const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64)]);
const PDF = Buffer.from('%PDF-1.7\n%fake but typed by its header\n');

describe('attachments', () => {
  it('stores PNG and PDF judged by content, serves them to students, and refuses other content', async () => {
    const png = await call(t, 'post', `/api/labs/${labId}/attachments`, cast.instructor.cookie).attach('file', PNG, { filename: 'wiring.pdf', contentType: 'application/pdf' });
    expect(png.status, png.text).toBe(201);
    expect(png.body.attachment).toMatchObject({ contentType: 'image/png', size: PNG.length });
    expect((await call(t, 'post', `/api/labs/${labId}/attachments`, cast.instructor.cookie).attach('file', PDF, { filename: 'sheet.pdf' })).body.attachment.contentType).toBe('application/pdf');
    const fake = await call(t, 'post', `/api/labs/${labId}/attachments`, cast.instructor.cookie).attach('file', Buffer.from('<svg/>'), { filename: 'x.png', contentType: 'image/png' });
    expect(fake.status).toBe(415);
    expect(fake.body.error.fields.file).toMatch(/PNG, JPEG or PDF/);
    const big = await call(t, 'post', `/api/labs/${labId}/attachments`, cast.instructor.cookie).attach('file', Buffer.concat([PDF, Buffer.alloc(10 * 1024 * 1024)]), { filename: 'big.pdf' });
    expect(big.status).toBe(413);
    expect((await call(t, 'post', `/api/labs/${labId}/attachments`, cast.studentA.cookie).attach('file', PNG, { filename: 'a.png' })).status).toBe(403);
    const got = await call(t, 'get', png.body.attachment.url, cast.studentA.cookie);
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(got.body as Buffer, PNG)).toBe(0);
    const lab = await call(t, 'get', `/api/labs/${labId}`, cast.studentA.cookie);
    expect(lab.body.lab.attachments).toHaveLength(2);
  });
});

describe('grading limits', () => {
  it('grades a run past the virtual-time limit as such, with a clear note', async () => {
    // Three waits of 4 h, the longest a wait may be: 12 h against the 8 h a script may run.
    const long = { panel: 'reversing-conveyor', steps: [...Array.from({ length: 3 }, () => ({ wait: 4 * 3_600_000 })), { expect: { K1: 'open' }, label: 'still stopped' }] };
    const created = await call(t, 'post', `/api/classes/${cast.classId}/labs`, cast.instructor.cookie).send({ title: 'Long', script: long });
    expect(created.status, created.text).toBe(201);
    await publish(t, cast.instructor, created.body.lab.id);
    const res = await submitVersion(t, cast.studentB, created.body.lab.id, await saveInCopy(t, cast.studentB, created.body.lab.id, FORWARD_REVERSE.solution));
    expect(res.status).toBe(201);
    expect(res.body.submission.gradingNote).toMatch(/stopped before the end/);
    expect(res.body.submission.report.stoppedBy).toBeTruthy();
    expect(res.body.submission.autoScore).toBe(0);
  });
});
