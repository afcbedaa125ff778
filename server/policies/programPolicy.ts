/**
 * Who may do what with a program (issue 5): a student sees and changes only their own programs; an
 * instructor reads (never changes) the programs of students in the classes they teach, and owns
 * their own; an admin may do everything. A draft (unsaved editor state) is its owner's alone: not
 * even an admin or the instructor sees it, and to everyone else it does not exist.
 */
import type { Db } from '../db/client';
import type { User } from '../db/users';
import { teachesStudent } from '../db/classes';
import type { Access } from './access';

export type ProgramAction = 'read' | 'write' | 'draft';

/** May `actor` act on the programs owned by `ownerId`? */
export async function programAccess(db: Db, actor: User, ownerId: string, action: ProgramAction): Promise<Access> {
  if (action === 'draft') return actor.id === ownerId ? 'allowed' : 'hidden';
  if (actor.role === 'admin' || actor.id === ownerId) return 'allowed';
  if (actor.role === 'instructor' && (await teachesStudent(db, actor.id, ownerId))) {
    return action === 'read' ? 'allowed' : 'forbidden';
  }
  return 'hidden';
}
