/** Test data and requests as a given user. Users are inserted directly (cheap hashes); sessions come from the real sign-in route. */
import type { Test } from 'supertest';
import { hashPassword } from '../../../server/auth/passwords';
import { insertUser, type User } from '../../../server/db/users';
import { enrol, insertClass } from '../../../server/db/classes';
import { TEST_SCRYPT, type TestApp } from './testApp';

export const PASSWORD = 'correct-horse-battery';

export interface Person {
  user: User;
  /** The Cookie header of a signed-in session. */
  cookie: string;
}

export async function addUser(t: TestApp, email: string, role: User['role'], name = email.split('@')[0]): Promise<User> {
  const user = await insertUser(t.database.orm, { email, name, role, passwordHash: await hashPassword(PASSWORD, TEST_SCRYPT), createdAt: t.clock.now() });
  if (!user) throw new Error(`user ${email} exists`);
  return user;
}

/** The session cookie from a response's Set-Cookie header, as a Cookie header value. */
export function sessionCookieOf(setCookie: string[] | string | undefined): string {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const found = list.find((c) => c.startsWith('rw_session='));
  if (!found) throw new Error('no session cookie was set');
  return found.split(';')[0];
}

export async function signIn(t: TestApp, email: string, password = PASSWORD): Promise<string> {
  const res = await t.http.post('/api/auth/sign-in').set('Origin', t.origin).send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${res.text}`);
  return sessionCookieOf(res.headers['set-cookie']);
}

export async function person(t: TestApp, email: string, role: User['role']): Promise<Person> {
  const user = await addUser(t, email, role);
  return { user, cookie: await signIn(t, email) };
}

type Method = 'get' | 'post' | 'patch' | 'delete' | 'put';

/** A request as `cookie` (or anonymous), with this site's Origin. */
export function call(t: TestApp, method: Method, path: string, cookie?: string | null): Test {
  const req = t.http[method](path).set('Origin', t.origin);
  return cookie ? req.set('Cookie', cookie) : req;
}

/** A valid document with `n` rungs (a seal-in circuit repeated), for saves. */
export function documentWithRungs(n: number, title = 'Test program') {
  return {
    format: 'rungwright.program',
    version: 1,
    title,
    description: '',
    tags: [],
    rungs: Array.from({ length: n }, (_, i) => ({
      id: `r${i + 1}`,
      comment: '',
      network: {
        kind: 'series',
        id: `s${i + 1}`,
        items: [
          { kind: 'contact', id: `c${i + 1}`, variant: 'no', operand: '%IX1' },
          { kind: 'coil', id: `q${i + 1}`, variant: 'coil', operand: `%MX${i + 1}` },
        ],
      },
    })),
  };
}

/**
 * The cast of the access-control matrix: a class taught by `instructor` with students A and B,
 * another instructor with a class of their own, an admin.
 */
export interface Cast {
  admin: Person;
  instructor: Person;
  otherInstructor: Person;
  studentA: Person;
  studentB: Person;
  classId: string;
  otherClassId: string;
}

export async function createCast(t: TestApp): Promise<Cast> {
  const admin = await person(t, 'admin@test.example', 'admin');
  const instructor = await person(t, 'teach@test.example', 'instructor');
  const otherInstructor = await person(t, 'other.teach@test.example', 'instructor');
  const studentA = await person(t, 'student.a@test.example', 'student');
  const studentB = await person(t, 'student.b@test.example', 'student');
  const cls = await insertClass(t.database.orm, { name: 'Motor Control 1', term: 'Fall 2026', instructorId: instructor.user.id, joinCode: 'TEST-CODE', now: t.clock.now() });
  const other = await insertClass(t.database.orm, { name: 'Other class', term: 'Fall 2026', instructorId: otherInstructor.user.id, joinCode: 'OTHR-CODE', now: t.clock.now() });
  if (!cls || !other) throw new Error('classes not created');
  await enrol(t.database.orm, cls.id, studentA.user.id, t.clock.now());
  await enrol(t.database.orm, cls.id, studentB.user.id, t.clock.now());
  return { admin, instructor, otherInstructor, studentA, studentB, classId: cls.id, otherClassId: other.id };
}

/** Creates a program as `who` and returns its id. */
export async function createProgramAs(t: TestApp, who: Person, title = 'Conveyor'): Promise<string> {
  const res = await call(t, 'post', '/api/programs', who.cookie).send({ title, document: documentWithRungs(1, title) });
  if (res.status !== 201) throw new Error(`create program failed: ${res.status} ${res.text}`);
  return res.body.program.id as string;
}
