/**
 * Class invitations by relationship: a roster row or a hand-made invitation enrols nobody; the
 * invited person accepts (a new account sets its password, an existing student account joins
 * signed in as itself); the uploader never learns what kind of account an address has; a newer
 * invitation ends the older one, and using one ends the others.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ClassSummarySchema, InvitationViewSchema, RosterReportSchema } from '@shared/api';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, person, signIn, type Person } from './helpers/fixtures';
import { tokenIn, type Mail } from './helpers/mailbox';
import { createClassroom, type Classroom } from './helpers/classroom';
import { INVITE_TOKEN_MS, newToken } from '../../server/auth/oneTimeTokens';
import { insertToken } from '../../server/db/oneTimeTokens';

let t: TestApp;
let room: Classroom;
let admin: Person;
beforeAll(async () => {
  t = await createTestApp();
  room = await createClassroom(t);
  admin = room.people.admin;
});
afterAll(() => t.close());

const roster = (csv: string, classId = room.classA.id, cookie = room.people.teacherA.cookie) =>
  call(t, 'post', `/api/classes/${classId}/roster`, cookie).attach('file', Buffer.from(csv), { filename: 'roster.csv', contentType: 'text/csv' });

const inviteByHand = (email: string, name = 'By Hand', classId = room.classA.id, cookie = room.people.teacherA.cookie) =>
  call(t, 'post', `/api/classes/${classId}/invitations`, cookie).send({ email, name });

const lookup = (token: string) => call(t, 'post', '/api/auth/invitations/lookup').send({ token });
const join = (token: string, cookie: string) => call(t, 'post', '/api/auth/invitations/join', cookie).send({ token });

async function studentsOf(classId: string): Promise<string[]> {
  const res = await call(t, 'get', `/api/classes/${classId}/students`, room.people.teacherA.cookie);
  return (res.body.students as { email: string }[]).map((s) => s.email);
}

/** Every mail to `to` so far, oldest first (the mailbox lists newest first, by the clock: tests that send twice advance it between). */
async function mailTo(to: string): Promise<Mail[]> {
  return ((await call(t, 'get', '/api/dev/mail', admin.cookie)).body.mail as Mail[]).filter((m) => m.to.toLowerCase().includes(to.toLowerCase())).reverse();
}

describe('a roster upload', () => {
  it('invites an existing student, an instructor, an admin and a new address alike, and enrols none of them', async () => {
    const lonely = await person(t, 'lonely@test.example', 'student');
    const csv = [
      'email,name',
      'lonely@test.example,Lonely Student',
      'teacher.b@test.example,Another Teacher',
      'admin@test.example,The Admin',
      'brand.new@test.example,Brand New',
      'student.one@test.example,Already In',
    ].join('\n');
    const res = await roster(csv);
    expect(res.status).toBe(200);
    const report = RosterReportSchema.parse(res.body.report);
    expect(report.invited).toEqual([
      { line: 2, email: 'lonely@test.example', name: 'Lonely Student' },
      { line: 3, email: 'teacher.b@test.example', name: 'Another Teacher' },
      { line: 4, email: 'admin@test.example', name: 'The Admin' },
      { line: 5, email: 'brand.new@test.example', name: 'Brand New' },
    ]);
    expect(report.already).toEqual([{ line: 6, email: 'student.one@test.example', name: 'Already In', reason: 'already in the class' }]);
    expect(report.rejected).toEqual([]);
    expect(JSON.stringify(res.body)).not.toMatch(/instructor|admin account|student account/);

    const students = await studentsOf(room.classA.id);
    expect(students).not.toContain('lonely@test.example');
    expect(students).not.toContain('teacher.b@test.example');
    const lonelyClasses = await call(t, 'get', '/api/classes', lonely.cookie);
    expect(lonelyClasses.body.classes).toEqual([]);
    // Teacher A reads nothing of the invited student meanwhile.
    expect((await call(t, 'get', `/api/programs?ownerId=${lonely.user.id}`, room.people.teacherA.cookie)).status).toBe(404);

    const again = RosterReportSchema.parse((await roster(csv)).body.report);
    expect(again.invited).toEqual([]);
    expect(again.already.map((r) => r.reason)).toEqual(['already invited', 'already invited', 'already invited', 'already invited', 'already in the class']);
  });

  it('lets the existing student join only when signed in as that address, and only once', async () => {
    const mail = (await mailTo('lonely@test.example'))[0]!;
    expect(mail.subject).toBe('You are invited to Motor Control A');
    expect(mail.text).toMatch(/has a Rungwright account already/);
    const token = tokenIn(mail);
    const view = InvitationViewSchema.parse((await lookup(token)).body.invitation);
    expect(view).toMatchObject({ email: 'lonely@test.example', role: 'student', classId: room.classA.id, className: 'Motor Control A', hasAccount: true });

    // Signed in as someone else: refused, to them; nothing changes and the link still works.
    const other = await join(token, room.people.studentNone.cookie);
    expect(other.status).toBe(403);
    expect(other.body.error.message).toMatch(/another e-mail address/);
    expect(await studentsOf(room.classA.id)).not.toContain('lonely@test.example');
    expect(await studentsOf(room.classA.id)).not.toContain('student.none@test.example');
    // Not signed in: sign in first.
    expect((await call(t, 'post', '/api/auth/invitations/join').send({ token })).status).toBe(401);
    // Accepting as a new account is not how an existing one joins.
    const asNew = await call(t, 'post', '/api/auth/invitations/accept').send({ token, name: 'Impostor', password: 'long-enough-pw' });
    expect(asNew.status).toBe(409);
    expect(asNew.body.error.message).toMatch(/sign in with it, then open this link again/);

    const lonelyCookie = await signIn(t, 'LONELY@test.example');
    const joined = await join(token, lonelyCookie);
    expect(joined.status).toBe(200);
    expect(ClassSummarySchema.parse(joined.body.class)).toMatchObject({ id: room.classA.id, joinCode: null });
    expect(await studentsOf(room.classA.id)).toContain('lonely@test.example');
    const twice = await join(token, lonelyCookie);
    expect(twice.status).toBe(400);
    expect(twice.body.error.fields).toHaveProperty('token');
  });

  it('refuses an instructor and an admin at acceptance, telling them, and enrols neither', async () => {
    for (const [who, address] of [['teacherB', 'teacher.b@test.example'], ['admin', 'admin@test.example']] as const) {
      const token = tokenIn((await mailTo(address))[0]!);
      expect(InvitationViewSchema.parse((await lookup(token)).body.invitation).hasAccount).toBe(true);
      const res = await join(token, room.people[who].cookie);
      expect(res.status).toBe(403);
      expect(res.body.error.message).toMatch(/^Only student accounts join a class as students/);
      expect(await studentsOf(room.classA.id)).not.toContain(address);
    }
  });

  it('creates a new address\'s student account in the class when it sets its password', async () => {
    const token = tokenIn((await mailTo('brand.new@test.example'))[0]!);
    expect(InvitationViewSchema.parse((await lookup(token)).body.invitation).hasAccount).toBe(false);
    const made = await call(t, 'post', '/api/auth/invitations/accept').send({ token, name: 'Brand New', password: 'long-enough-pw' });
    expect(made.status).toBe(201);
    expect(made.body.user).toMatchObject({ email: 'brand.new@test.example', role: 'student' });
    expect(await studentsOf(room.classA.id)).toContain('brand.new@test.example');
  });
});

describe('no stale invitations', () => {
  it('ends the open invitation of an address for a class when a new one is sent to it, by hand or by roster', async () => {
    expect((await inviteByHand('twice@test.example', 'Twice')).status).toBe(201);
    await expect.poll(async () => (await mailTo('twice@test.example')).length).toBe(1);
    const first = tokenIn((await mailTo('twice@test.example'))[0]!);
    t.clock.advance(1000);
    const sent = await inviteByHand('twice@test.example', 'Twice');
    expect(sent.status).toBe(201);
    expect(sent.body.invitation).toMatchObject({ email: 'twice@test.example', name: 'Twice' });
    await expect.poll(async () => (await mailTo('twice@test.example')).length).toBe(2);
    const second = tokenIn((await mailTo('twice@test.example'))[1]!);
    expect((await lookup(first)).status).toBe(400);
    expect((await call(t, 'post', '/api/auth/invitations/accept').send({ token: first, name: 'Old', password: 'long-enough-pw' })).status).toBe(400);
    expect((await lookup(second)).status).toBe(200);
    const listed = (await call(t, 'get', `/api/classes/${room.classA.id}/invitations`, room.people.teacherA.cookie)).body.invitations as { email: string; usedAt: string | null; expiresAt: string }[];
    const open = listed.filter((i) => i.email === 'twice@test.example' && i.usedAt === null && Date.parse(i.expiresAt) > t.clock.now().getTime());
    expect(open).toHaveLength(1);
  });

  it('keeps an invitation to another class open, and ends the others of its class when one is used', async () => {
    // Two open links to the same address and class can only come from a race; made directly here.
    const now = t.clock.now();
    const links = [newToken(), newToken()];
    for (const link of links) {
      await insertToken(t.database.orm, { kind: 'invite', tokenHash: link.hash, email: 'racer@test.example', role: 'student', classId: room.classA.id, invitedName: 'Racer', expiresAt: new Date(now.getTime() + INVITE_TOKEN_MS), now });
    }
    expect((await inviteByHand('racer@test.example', 'Racer', room.classB.id, room.people.teacherB.cookie)).status).toBe(201);
    await expect.poll(async () => (await mailTo('racer@test.example')).length).toBe(1);
    const toClassB = tokenIn((await mailTo('racer@test.example'))[0]!);

    const made = await call(t, 'post', '/api/auth/invitations/accept').send({ token: links[0]!.token, name: 'Racer', password: 'long-enough-pw' });
    expect(made.status).toBe(201);
    expect((await lookup(links[1]!.token)).status).toBe(400);
    // The class B invitation is another scope: it still works, now for a signed-in account.
    const view = await lookup(toClassB);
    expect(view.status).toBe(200);
    expect(view.body.invitation).toMatchObject({ className: 'Motor Control B', hasAccount: true });
  });

  it('ends an older instructor invitation when a newer one goes to the same address', async () => {
    for (let i = 1; i <= 2; i += 1) {
      expect((await call(t, 'post', '/api/admin/instructor-invitations', admin.cookie).send({ email: 'new.teacher@test.example' })).status).toBe(201);
      await expect.poll(async () => (await mailTo('new.teacher@test.example')).length).toBe(i);
      t.clock.advance(1000);
    }
    const [older, newer] = (await mailTo('new.teacher@test.example')).map(tokenIn);
    expect((await lookup(older!)).status).toBe(400);
    const made = await call(t, 'post', '/api/auth/invitations/accept').send({ token: newer, name: 'New Teacher', password: 'long-enough-pw' });
    expect(made.status).toBe(201);
    expect(made.body.user.role).toBe('instructor');
  });
});

describe('inviting one student by hand', () => {
  it('refuses an address already in the class (409), names a bad field (400), and is for the class\'s staff only', async () => {
    const inClass = await inviteByHand('student.both@test.example');
    expect(inClass.status).toBe(409);
    expect(inClass.body.error.fields.email).toMatch(/in the class already/);
    const bad = await call(t, 'post', `/api/classes/${room.classA.id}/invitations`, room.people.teacherA.cookie).send({ email: 'nope', name: '' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['email', 'name']);
    expect((await inviteByHand('someone@test.example', 'Someone', room.classA.id, room.people.teacherB.cookie)).status).toBe(404);
  });

  it('answers the same for an address with an instructor account as for a new one', async () => {
    const instructor = await inviteByHand('teacher.b@test.example', 'Same Shape');
    const fresh = await inviteByHand('nobody.yet@test.example', 'Same Shape');
    expect(instructor.status).toBe(201);
    expect(fresh.status).toBe(201);
    expect(Object.keys(instructor.body.invitation).sort()).toEqual(Object.keys(fresh.body.invitation).sort());
    expect(instructor.body.invitation.expiresAt).toBe(fresh.body.invitation.expiresAt);
  });
});
