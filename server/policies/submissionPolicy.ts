/**
 * Who may see a submission in full (hidden checks, trace, the program) and grade it: the class's
 * instructor only. An admin does not read student work (unless they teach the class themselves).
 * Its student sees it only redacted, through their own list (403 here, as they know it exists);
 * anyone else does not learn it exists.
 */
import type { User } from '../db/users';
import type { ClassRecord } from '../db/classes';
import type { SubmissionRecord } from '../db/submissions';
import type { Access } from './access';
import { teachesClass } from './labPolicy';

export type SubmissionAction = 'review' | 'grade';

export function submissionAccess(actor: User, submission: SubmissionRecord, cls: ClassRecord, _action: SubmissionAction): Access {
  if (teachesClass(actor, cls)) return 'allowed';
  if (actor.id === submission.studentId) return 'forbidden';
  return 'hidden';
}
