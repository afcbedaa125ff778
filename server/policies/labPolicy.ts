/**
 * Who may do what with a lab: the class's instructor and admins manage it (authoring, publishing,
 * "Try it"); only the class's instructor reviews its students' work (the submission list, regrade):
 * admins keep classes running and do not read student work. An enrolled student views a published
 * lab and works on it (open, self-check, submit); an unpublished lab does not exist for a student;
 * anyone else does not see it.
 */
import type { User } from '../db/users';
import type { ClassRecord } from '../db/classes';
import type { LabRecord } from '../db/labs';
import type { Access } from './access';

export type LabAction = 'view' | 'manage' | 'work' | 'review';

/** True for the people who run the class: its instructor and admins. */
export const managesClass = (actor: User, cls: ClassRecord): boolean => actor.role === 'admin' || actor.id === cls.instructorId;

/** True for the class's own instructor: the one person who reads and grades its students' work. */
export const teachesClass = (actor: User, cls: ClassRecord): boolean => actor.id === cls.instructorId;

/** `enrolled`: the actor is enrolled in the lab's class (read with the lab, in the same query). */
export function labAccess(actor: User, lab: LabRecord, cls: ClassRecord, enrolled: boolean, action: LabAction): Access {
  if (managesClass(actor, cls)) {
    if (action === 'work') return 'forbidden';
    if (action === 'review') return teachesClass(actor, cls) ? 'allowed' : 'forbidden';
    return 'allowed';
  }
  if (actor.role === 'student' && lab.publishedAt !== null && enrolled) {
    return action === 'view' || action === 'work' ? 'allowed' : 'forbidden';
  }
  return 'hidden';
}
