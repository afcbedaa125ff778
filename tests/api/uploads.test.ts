import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RosterReportSchema } from '@shared/api';
import { exportPlcopen } from '@shared/ladder/plcopen';
import { REVERSING_DEMO } from '../../server/db/demoPrograms';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, person, type Cast } from './helpers/fixtures';
import { tokenIn, waitForMail } from './helpers/mailbox';

let t: TestApp;
let cast: Cast;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
});
afterAll(() => t.close());

const roster = (csv: string, name = 'roster.csv', type = 'text/csv') =>
  call(t, 'post', `/api/classes/${cast.classId}/roster`, cast.instructor.cookie).attach('file', Buffer.from(csv), { filename: name, contentType: type });

describe('roster CSV upload', () => {
  it('reports invited, already in the class and rejected rows with the reason, and mails the invitations', async () => {
    await person(t, 'existing@test.example', 'student');
    const csv = [
      'email,name',
      'existing@test.example,Existing Student',
      'student.a@test.example,Already In',
      'fresh@test.example,Fresh Face',
      'not-an-email,Bad Address',
      'noname@test.example,',
      'FRESH@test.example,Duplicate',
      'teach@test.example,An Instructor',
    ].join('\n');
    const res = await roster(csv);
    expect(res.status).toBe(200);
    const report = RosterReportSchema.parse(res.body.report);
    // An existing account and an instructor's address are invited like any other: nobody is enrolled here.
    expect(report.invited.map((r) => r.email)).toEqual(['existing@test.example', 'fresh@test.example', 'teach@test.example']);
    expect(report.already.map((r) => [r.email, r.reason])).toEqual([['student.a@test.example', 'already in the class']]);
    expect(report.rejected.map((r) => [r.line, r.reason])).toEqual([
      [5, expect.stringMatching(/^email: /)],
      [6, expect.stringMatching(/^name: /)],
      [7, 'this e-mail appears on an earlier line'],
    ]);

    const mail = await waitForMail(t, cast.admin.cookie, 'fresh@test.example');
    expect(mail.subject).toBe('You are invited to Motor Control 1');
    const accepted = await call(t, 'post', '/api/auth/invitations/accept').send({ token: tokenIn(mail), name: 'Fresh Face', password: 'fresh-password' });
    expect(accepted.status).toBe(201);
    const students = await call(t, 'get', `/api/classes/${cast.classId}/students`, cast.instructor.cookie);
    const emails = students.body.students.map((s: { email: string }) => s.email);
    expect(emails).toContain('fresh@test.example');
    expect(emails).not.toContain('existing@test.example');

    const again = RosterReportSchema.parse((await roster(csv)).body.report);
    expect(again.invited).toEqual([]);
    expect(again.already.map((r) => [r.email, r.reason])).toEqual([
      ['existing@test.example', 'already invited'],
      ['student.a@test.example', 'already in the class'],
      ['fresh@test.example', 'already in the class'],
      ['teach@test.example', 'already invited'],
    ]);
  });

  it('refuses a CSV without the email,name header, naming the file field', async () => {
    const res = await roster('mail;fullname\na@b.example;A');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('file');
  });

  it('refuses a file that is not CSV with 415', async () => {
    const res = await roster('%PDF-1.7', 'roster.pdf', 'application/pdf');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });

  it('refuses a request without a file (400) and a JSON body (415)', async () => {
    const none = await call(t, 'post', `/api/classes/${cast.classId}/roster`, cast.instructor.cookie).field('note', 'no file');
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toHaveProperty('file');
    const json = await call(t, 'post', `/api/classes/${cast.classId}/roster`, cast.instructor.cookie).send({ csv: 'email,name' });
    expect(json.status).toBe(415);
  });
});

const importXml = (xml: string | Buffer, name = 'program.xml', type = 'application/xml') =>
  call(t, 'post', '/api/programs/import', cast.studentA.cookie).attach('file', Buffer.isBuffer(xml) ? xml : Buffer.from(xml), { filename: name, contentType: type });

describe('PLCopen XML import', () => {
  it('imports an exported program into a new program with version 1', async () => {
    const res = await importXml(exportPlcopen(REVERSING_DEMO));
    expect(res.status).toBe(201);
    expect(res.body.program.headVersion).toBe(1);
    expect(res.body.head.document.rungs.map((r: { id: string }) => r.id)).toEqual(['r1', 'r2', 'r3']);
    expect(res.body.head.message).toBe('Imported from program.xml');
  });

  it('gives an import whose title is already one of the user\'s programs the next free "(n)" title', async () => {
    const xml = exportPlcopen({ ...REVERSING_DEMO, title: 'Twin conveyor' });
    const titles = [];
    for (let i = 0; i < 3; i += 1) titles.push((await importXml(xml)).body.program.title);
    expect(titles).toEqual(['Twin conveyor', 'Twin conveyor (2)', 'Twin conveyor (3)']);
  });

  it('refuses an XML bomb (DOCTYPE with entities) before parsing', async () => {
    const bomb = '<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;">]><project>&lol2;</project>';
    const res = await importXml(bomb);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/DOCTYPE/);
  });

  it('refuses a file over 1 MB with 413', async () => {
    const res = await importXml(Buffer.alloc(1024 * 1024 + 10, 'a'));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('refuses a file that is not XML with 415', async () => {
    const res = await importXml('{"format":"rungwright.program"}', 'program.json', 'application/json');
    expect(res.status).toBe(415);
  });

  it('refuses XML that is not a PLCopen project with 422 and the reason', async () => {
    const res = await importXml('<?xml version="1.0"?><recipe><step/></recipe>');
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/not a PLCopen/);
  });
});
