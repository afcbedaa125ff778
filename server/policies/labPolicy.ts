/**
 * Who may do what with a lab: the class's instructor and admins manage it (authoring, publishing,
 * "Try it", review, regrade); an enrolled student views a published lab and works on it (open,
 * self-check, submit); an unpublished lab does not exist for a student; anyone else does not see it.
 */
import type { User } from '../db/users';
import type { ClassRecord } from '../db/classes';
import type { LabRecord } from '../db/labs';
import type { Access } from './access';

export type LabAction = 'view' | 'manage' | 'work';

/** True for the people who run the class: its instructor and admins. */
export const managesClass = (actor: User, cls: ClassRecord): boolean => actor.role === 'admin' || actor.id === cls.instructorId;

/** `enrolled`: the actor is enrolled in the lab's class (read with the lab, in the same query). */
export function labAccess(actor: User, lab: LabRecord, cls: ClassRecord, enrolled: boolean, action: LabAction): Access {
  if (managesClass(actor, cls)) return action === 'work' ? 'forbidden' : 'allowed';
  if (actor.role === 'student' && lab.publishedAt !== null && enrolled) {
    return action === 'manage' ? 'forbidden' : 'allowed';
  }
  return 'hidden';
}
