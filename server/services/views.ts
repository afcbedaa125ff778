/** Plain db objects → the API's shapes (`shared/api`): dates as ISO strings, nothing secret. */
import type { ClassSummary, ProgramSummary, UserView, VersionDetail, VersionSummary } from '@shared/api';
import type { User } from '../db/users';
import type { Program, ProgramVersion, VersionSummary as VersionRow } from '../db/programs';
import type { ClassRecord } from '../db/classes';

export const iso = (d: Date): string => d.toISOString();

export function userView(u: User): UserView {
  return { id: u.id, email: u.email, name: u.name, role: u.role, demo: u.demo, createdAt: iso(u.createdAt), lastSignInAt: u.lastSignInAt ? iso(u.lastSignInAt) : null };
}

export function programView(p: Program): ProgramSummary {
  return { id: p.id, ownerId: p.ownerId, title: p.title, labId: p.labId, headVersion: p.headVersion, demo: p.demo, createdAt: iso(p.createdAt), updatedAt: iso(p.updatedAt) };
}

export function versionView(v: VersionRow): VersionSummary {
  return { number: v.number, message: v.message, authorId: v.authorId, createdAt: iso(v.createdAt) };
}

export function versionDetailView(v: ProgramVersion): VersionDetail {
  return { ...versionView(v), document: v.document };
}

/** `manager` = the class's instructor or an admin: only they see the join code and the head count. */
export function classView(c: ClassRecord, manager: { studentCount: number } | null): ClassSummary {
  return {
    id: c.id,
    name: c.name,
    term: c.term,
    instructorId: c.instructorId,
    joinCode: manager ? c.joinCode : null,
    studentCount: manager ? manager.studentCount : null,
    demo: c.demo,
    createdAt: iso(c.createdAt),
  };
}
