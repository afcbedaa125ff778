/**
 * Similar submissions of one lab: each student's newest submission compared with every other's by
 * the structure of their rung networks beyond the starter (`shared/ladder/similarity.ts`), and one
 * pair side by side. A signal for the instructor to talk with two students, not a finding; the
 * page says so. The class's own instructor only (`review`).
 */
import type { SideBySide, SimilarList } from '@shared/api/teaching';
import { parseProgram, rungText, type Program } from '@shared/ladder';
import { ALIKE_THRESHOLD, compareFingerprints, fingerprint, type ProgramFingerprint } from '@shared/ladder/similarity';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { listSubmissionsOfLab, type SubmissionWithStudent } from '../db/submissions';
import { failure, success, type Outcome } from '../http/failure';
import { authorisedLab } from './labs';

interface Compared {
  entry: SubmissionWithStudent;
  program: Program;
  print: ProgramFingerprint;
}

function programOf(document: unknown): Program | null {
  const parsed = parseProgram(document);
  return parsed.ok ? parsed.value : null;
}

async function newestPrograms(ctx: AppContext, labId: string): Promise<Compared[]> {
  const newest = new Map<string, SubmissionWithStudent>();
  for (const entry of await listSubmissionsOfLab(ctx.orm, labId)) newest.set(entry.student.id, entry);
  const out: Compared[] = [];
  for (const entry of newest.values()) {
    const program = programOf(entry.submission.document);
    if (program) out.push({ entry, program, print: fingerprint(program) });
  }
  return out.sort((a, b) => a.entry.student.name.localeCompare(b.entry.student.name));
}

export async function similarSubmissions(ctx: AppContext, actor: User, labId: string): Promise<Outcome<SimilarList>> {
  const found = await authorisedLab(ctx, actor, labId, 'review');
  if (!found.ok) return found;
  const starterProgram = found.value.lab.starterDocument ? programOf(found.value.lab.starterDocument) : null;
  const starter = starterProgram ? fingerprint(starterProgram) : null;
  const compared = await newestPrograms(ctx, labId);
  const pairs: SimilarList['pairs'] = [];
  for (let i = 0; i < compared.length; i += 1) {
    for (let j = i + 1; j < compared.length; j += 1) {
      const a = compared[i]!;
      const b = compared[j]!;
      const result = compareFingerprints(a.print, b.print, starter);
      if (result.score < ALIKE_THRESHOLD) continue;
      pairs.push({
        a: { submissionId: a.entry.submission.id, student: a.entry.student },
        b: { submissionId: b.entry.submission.id, student: b.entry.student },
        score: result.score,
        matchedRungs: result.matchedA.filter(Boolean).length,
      });
    }
  }
  pairs.sort((x, y) => y.score - x.score);
  return success({ threshold: ALIKE_THRESHOLD, compared: compared.length, pairs });
}

/** Two submissions of the lab side by side, rung by rung, with the rungs each shares with the other marked. */
export async function sideBySide(ctx: AppContext, actor: User, labId: string, aId: string, bId: string): Promise<Outcome<SideBySide>> {
  const found = await authorisedLab(ctx, actor, labId, 'review');
  if (!found.ok) return found;
  const all = await listSubmissionsOfLab(ctx.orm, labId);
  const a = all.find((e) => e.submission.id === aId);
  const b = all.find((e) => e.submission.id === bId);
  if (!a || !b) return failure('not_found', 'One of these submissions is not a submission of this lab');
  const pa = programOf(a.submission.document);
  const pb = programOf(b.submission.document);
  if (!pa || !pb) return failure('conflict', 'One of these submissions holds no readable program');
  const starterProgram = found.value.lab.starterDocument ? programOf(found.value.lab.starterDocument) : null;
  const result = compareFingerprints(fingerprint(pa), fingerprint(pb), starterProgram ? fingerprint(starterProgram) : null);
  const side = (entry: SubmissionWithStudent, program: Program, matched: boolean[]) => ({
    submissionId: entry.submission.id,
    student: entry.student,
    version: entry.submission.versionNumber,
    rungs: program.rungs.map((rung, i) => ({ comment: rung.comment, text: rungText(rung, program), matched: matched[i] ?? false })),
  });
  return success({ score: result.score, a: side(a, pa, result.matchedA), b: side(b, pb, result.matchedB) });
}
