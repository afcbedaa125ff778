/**
 * Who may do what with a lab: the class's instructor and admins manage it (authoring, publishing,
 * "Try it", review, regrade); an enrolled student views a published lab and works on it (open,
 * self-check, submit); an unpublished lab does not exist for a student; anyone else does not see it.
 */
import type { Db } from '../db/client';
import type { User } from '../db/users';
import { isEnrolled, type ClassRecord } from '../db/classes';
import type { LabRecord } from '../db/labs';
import type { Access } from './access';

export type LabAction = 'view' | 'manage' | 'work';

/** True for the people who run the class: its instructor and admins. */
export const managesClass = (actor: User, cls: ClassRecord): boolean => actor.role === 'admin' || actor.id === cls.instructorId;

export async function labAccess(db: Db, actor: User, lab: LabRecord, cls: ClassRecord, action: LabAction): Promise<Access> {
  if (managesClass(actor, cls)) return action === 'work' ? 'forbidden' : 'allowed';
  if (actor.role === 'student' && lab.publishedAt !== null && (await isEnrolled(db, cls.id, actor.id))) {
    return action === 'manage' ? 'forbidden' : 'allowed';
  }
  return 'hidden';
}
