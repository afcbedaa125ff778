import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ClassListSchema, StudentListSchema } from '@shared/api';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, person, type Cast } from './helpers/fixtures';

let t: TestApp;
let cast: Cast;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
});
afterAll(() => t.close());

describe('classes', () => {
  it('lets an instructor create a class and get a join code in the XXXX-XXXX form', async () => {
    const res = await call(t, 'post', '/api/classes', cast.instructor.cookie).send({ name: 'Motor Control 2', term: 'Winter 2027' });
    expect(res.status).toBe(201);
    expect(res.body.class.joinCode).toMatch(/^[2-9A-HJKMNP-Z]{4}-[2-9A-HJKMNP-Z]{4}$/);
    expect(res.body.class.studentCount).toBe(0);
  });

  it('names the missing term (400)', async () => {
    const res = await call(t, 'post', '/api/classes', cast.instructor.cookie).send({ name: 'No term' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('term');
  });

  it('refuses a student creating a class (403)', async () => {
    expect((await call(t, 'post', '/api/classes', cast.studentA.cookie).send({ name: 'Mine', term: 'Now' })).status).toBe(403);
  });

  it('lists taught classes for the instructor and enrolled classes for a student', async () => {
    const taught = ClassListSchema.parse((await call(t, 'get', '/api/classes', cast.instructor.cookie)).body).classes;
    expect(taught.map((c) => c.id)).toContain(cast.classId);
    expect(taught.map((c) => c.id)).not.toContain(cast.otherClassId);
    const enrolled = ClassListSchema.parse((await call(t, 'get', '/api/classes', cast.studentA.cookie)).body).classes;
    expect(enrolled.map((c) => c.id)).toEqual([cast.classId]);
  });

  it('regenerates the join code; the old code stops working', async () => {
    const before = (await call(t, 'get', `/api/classes/${cast.classId}`, cast.instructor.cookie)).body.class.joinCode;
    const res = await call(t, 'post', `/api/classes/${cast.classId}/join-code`, cast.instructor.cookie).send({});
    expect(res.status).toBe(200);
    expect(res.body.class.joinCode).not.toBe(before);
    const late = await call(t, 'post', '/api/auth/sign-up').send({ email: 'late@test.example', name: 'Late', joinCode: before });
    expect(late.status).toBe(400);
    const onTime = await call(t, 'post', '/api/auth/sign-up').send({ email: 'ontime@test.example', name: 'On Time', joinCode: res.body.class.joinCode });
    expect(onTime.status).toBe(202);
  });

  it('lists and removes students', async () => {
    const list = StudentListSchema.parse((await call(t, 'get', `/api/classes/${cast.classId}/students`, cast.instructor.cookie)).body).students;
    expect(list.map((s) => s.email)).toEqual(expect.arrayContaining(['student.a@test.example', 'student.b@test.example']));
    const extra = await person(t, 'leaver@test.example', 'student');
    const otherCode = (await call(t, 'get', `/api/classes/${cast.classId}`, cast.instructor.cookie)).body.class.joinCode;
    expect((await call(t, 'post', '/api/classes/join', extra.cookie).send({ joinCode: otherCode })).status).toBe(200);
    expect((await call(t, 'delete', `/api/classes/${cast.classId}/students/${extra.user.id}`, cast.instructor.cookie)).status).toBe(204);
    expect((await call(t, 'delete', `/api/classes/${cast.classId}/students/${extra.user.id}`, cast.instructor.cookie)).status).toBe(404);
    expect((await call(t, 'get', `/api/classes/${cast.classId}`, extra.cookie)).status).toBe(404);
  });

  it('names a malformed join code (400) when a student joins', async () => {
    const res = await call(t, 'post', '/api/classes/join', cast.studentB.cookie).send({ joinCode: '!' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('joinCode');
  });

  it('lists the invitations of a class (empty before any roster)', async () => {
    const res = await call(t, 'get', `/api/classes/${cast.classId}/invitations`, cast.instructor.cookie);
    expect(res.status).toBe(200);
    expect(res.body.invitations).toEqual([]);
  });
});
