/**
 * Who may do what with a program: access by relationship, not by role. Its owner does everything.
 * Someone else may read it (never change it) only when it belongs to a lab of a class they teach
 * and its owner is enrolled in that class: a student's work for that class. A program outside labs
 * is its owner's alone, not even their instructor's; and a copy of another class's lab is that
 * class's instructor's business only. Admins keep accounts and classes running and do not read
 * student work: an admin reads a program only where they teach the class themselves. A draft
 * (unsaved editor state) and a proof sheet (properties and kept counterexamples) are their owner's
 * alone: to everyone else they do not exist.
 */
import type { Db } from '../db/client';
import type { User } from '../db/users';
import type { Program } from '../db/programs';
import { labsTaughtToStudent, teachesLabOf } from '../db/classes';
import type { Access } from './access';

export type ProgramAction = 'read' | 'write' | 'draft' | 'proof';

/** May `actor` act on `program`? */
export async function programAccess(db: Db, actor: User, program: Pick<Program, 'ownerId' | 'labId'>, action: ProgramAction): Promise<Access> {
  if (action === 'draft' || action === 'proof') return actor.id === program.ownerId ? 'allowed' : 'hidden';
  if (actor.id === program.ownerId) return 'allowed';
  if (program.labId !== null && (await teachesLabOf(db, actor.id, program.labId, program.ownerId))) {
    return action === 'read' ? 'allowed' : 'forbidden';
  }
  return 'hidden';
}

/**
 * Which of `ownerId`'s programs `actor` may list: every one (their own), those in the given labs
 * (the labs of the classes the actor teaches the owner in), or none, and then the owner's list
 * does not exist for them.
 */
export type ProgramListAccess = { kind: 'all' } | { kind: 'labs'; labIds: ReadonlySet<string> } | { kind: 'hidden' };

export async function programListAccess(db: Db, actor: User, ownerId: string): Promise<ProgramListAccess> {
  if (actor.id === ownerId) return { kind: 'all' };
  const labIds = await labsTaughtToStudent(db, actor.id, ownerId);
  return labIds.length > 0 ? { kind: 'labs', labIds: new Set(labIds) } : { kind: 'hidden' };
}
