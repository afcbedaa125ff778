/**
 * "Return all graded": every student's newest submission of a lab that is graded and not yet
 * returned goes back to its student at once, each with an e-mail, and one optional note added to
 * each one's feedback. A submission still waiting for grading (`submitted`) stays.
 */
import type { ReturnGradedRequest } from '@shared/api/teaching';
import { publicUrl } from '../config';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { findUserById } from '../db/users';
import { listSubmissionStandings, markReturned, newestByStudent } from '../db/teaching';
import { success, type Outcome } from '../http/failure';
import { submissionReturnedMail } from '../mail/templates';
import { authorisedLab } from './labs';

/** The feedback after the note: the note on its own, or below what was written already. */
export function withNote(feedback: string | null, note: string | undefined): string | null {
  if (!note) return feedback;
  return feedback && feedback.trim() !== '' ? `${feedback}\n\n${note}` : note;
}

export async function returnAllGraded(ctx: AppContext, actor: User, labId: string, req: ReturnGradedRequest): Promise<Outcome<{ returned: number }>> {
  const found = await authorisedLab(ctx, actor, labId, 'review');
  if (!found.ok) return found;
  const { lab } = found.value;
  const newest = [...newestByStudent(await listSubmissionStandings(ctx.orm, [labId])).values()].filter((s) => s.status === 'graded');
  const now = ctx.clock.now();
  let returned = 0;
  for (const s of newest) {
    const feedback = withNote(s.feedback, req.note);
    // Conditional on `graded`: a return made meanwhile from the review page is not sent twice.
    if (!(await markReturned(ctx.orm, s.id, now, feedback))) continue;
    returned += 1;
    const student = await findUserById(ctx.orm, s.studentId);
    if (!student) continue;
    const mail = submissionReturnedMail({ to: student.email, baseUrl: publicUrl(ctx.config), labTitle: lab.title, labId: lab.id, finalScore: s.score, totalPoints: lab.totalPoints, feedback });
    await ctx.mailer.send(mail).catch((err: unknown) => ctx.logger.warn({ err, submissionId: s.id }, 'the return e-mail could not be sent'));
  }
  return success({ returned });
}
