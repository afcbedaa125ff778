/** Classes: create, list, view, join code, students, invitations. Access via `classPolicy`. */
import type { ClassSummary, CreateClassRequest } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import * as db from '../db/classes';
import { listClassInvitations } from '../db/oneTimeTokens';
import { failure, success, type Outcome } from '../http/failure';
import { classAccess, mayCreateClass, type ClassAction } from '../policies/classPolicy';
import { refusal } from '../policies/access';
import { newJoinCode } from './joinCodes';
import { classView, iso } from './views';

/** A class the actor may act on, or the failure to answer. */
export async function authorisedClass(ctx: AppContext, actor: User, classId: string, action: ClassAction): Promise<Outcome<db.ClassRecord>> {
  const cls = await db.findClass(ctx.orm, classId);
  if (!cls) return failure('not_found', 'This class does not exist or is not open to you');
  return refusal(await classAccess(ctx.orm, actor, cls, action), 'class') ?? success(cls);
}

async function view(ctx: AppContext, actor: User, cls: db.ClassRecord): Promise<ClassSummary> {
  const manages = actor.role === 'admin' || actor.id === cls.instructorId;
  return classView(cls, manages ? { studentCount: await db.countStudents(ctx.orm, cls.id) } : null);
}

export async function createClass(ctx: AppContext, actor: User, req: CreateClassRequest, demo = false, joinCode?: string): Promise<Outcome<ClassSummary>> {
  if (!mayCreateClass(actor)) return failure('forbidden', 'Only instructors create classes');
  // A clash of random codes is rare; retry a few times rather than fail.
  for (let attempt = 0; attempt < 5; attempt += 1) {
    const cls = await db.insertClass(ctx.orm, { ...req, instructorId: actor.id, joinCode: joinCode ?? newJoinCode(), demo, now: ctx.clock.now() });
    if (cls) return success(await view(ctx, actor, cls));
    if (joinCode) break;
  }
  return failure('conflict', 'Could not find a free join code; try again');
}

export async function listClasses(ctx: AppContext, actor: User): Promise<ClassSummary[]> {
  const rows =
    actor.role === 'admin' ? await db.listAllClasses(ctx.orm) : actor.role === 'instructor' ? await db.listClassesTaughtBy(ctx.orm, actor.id) : await db.listClassesOf(ctx.orm, actor.id);
  return Promise.all(rows.map((c) => view(ctx, actor, c)));
}

export async function getClass(ctx: AppContext, actor: User, classId: string): Promise<Outcome<ClassSummary>> {
  const found = await authorisedClass(ctx, actor, classId, 'view');
  return found.ok ? success(await view(ctx, actor, found.value)) : found;
}

export async function regenerateJoinCode(ctx: AppContext, actor: User, classId: string): Promise<Outcome<ClassSummary>> {
  const found = await authorisedClass(ctx, actor, classId, 'manage');
  if (!found.ok) return found;
  for (let attempt = 0; attempt < 5; attempt += 1) {
    const code = newJoinCode();
    if (!(await db.findClassByJoinCode(ctx.orm, code)) && (await db.setJoinCode(ctx.orm, classId, code))) {
      return success(await view(ctx, actor, { ...found.value, joinCode: code }));
    }
  }
  return failure('conflict', 'Could not find a free join code; try again');
}

/** A signed-in student joins another class with its code. */
export async function joinClass(ctx: AppContext, actor: User, joinCode: string): Promise<Outcome<ClassSummary>> {
  if (actor.role !== 'student') return failure('forbidden', 'Only student accounts join classes');
  const cls = await db.findClassByJoinCode(ctx.orm, joinCode);
  if (!cls) return failure('validation', 'No class has this join code', { fields: { joinCode: 'no class has this join code' } });
  await db.enrol(ctx.orm, cls.id, actor.id, ctx.clock.now());
  return success(await view(ctx, actor, cls));
}

export async function listStudents(ctx: AppContext, actor: User, classId: string) {
  const found = await authorisedClass(ctx, actor, classId, 'manage');
  if (!found.ok) return found;
  const students = await db.listStudents(ctx.orm, classId);
  return success(students.map((s) => ({ id: s.id, email: s.email, name: s.name, enrolledAt: iso(s.enrolledAt) })));
}

export async function removeStudent(ctx: AppContext, actor: User, classId: string, studentId: string): Promise<Outcome<null>> {
  const found = await authorisedClass(ctx, actor, classId, 'manage');
  if (!found.ok) return found;
  return (await db.unenrol(ctx.orm, classId, studentId)) ? success(null) : failure('not_found', 'That student is not in this class');
}

export async function listInvitations(ctx: AppContext, actor: User, classId: string) {
  const found = await authorisedClass(ctx, actor, classId, 'manage');
  if (!found.ok) return found;
  const rows = await listClassInvitations(ctx.orm, classId);
  return success(rows.map((r) => ({ id: r.id, email: r.email, name: r.invitedName, expiresAt: iso(r.expiresAt), usedAt: r.usedAt ? iso(r.usedAt) : null })));
}
