/**
 * Who may do what with a class: its instructor and admins manage it (join code, students, roster,
 * invitations); only its instructor reads its grades (the gradebook): admins keep classes running
 * and do not read student work. An enrolled student may view its name and term; anyone else does
 * not see it.
 */
import type { Db } from '../db/client';
import type { User } from '../db/users';
import { isEnrolled, type ClassRecord } from '../db/classes';
import type { Access } from './access';

export type ClassAction = 'view' | 'manage' | 'grades';

export async function classAccess(db: Db, actor: User, cls: ClassRecord, action: ClassAction): Promise<Access> {
  if (actor.id === cls.instructorId) return 'allowed';
  if (actor.role === 'admin') return action === 'grades' ? 'forbidden' : 'allowed';
  if (actor.role === 'student' && (await isEnrolled(db, cls.id, actor.id))) return action === 'view' ? 'allowed' : 'forbidden';
  return 'hidden';
}

/** Instructors and admins create classes. */
export const mayCreateClass = (actor: User): boolean => actor.role === 'instructor' || actor.role === 'admin';
