/**
 * A class's labs as each caller sees them (students: published labs with their standing; staff:
 * every lab with its submission count), the student's own copy of the starter, and the
 * self-check script (visible checks only, see `selfCheckScript`).
 */
import type { LabListItem, LabPanel, LatePolicy, OpenLabResponseSchema, SelfCheckScript, StudentLabStatus } from '@shared/api';
import type { z } from 'zod';
import { createEmptyProgram } from '@shared/ladder';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import * as db from '../db/labs';
import { findProgram, findVersion, insertProgram, deleteProgram } from '../db/programs';
import { listSubmissionScores } from '../db/submissions';
import { failure, success, type Outcome } from '../http/failure';
import { managesClass } from '../policies/labPolicy';
import { authorisedClass } from './classes';
import { labRun, selfCheckScript } from './labChecks';
import { authorisedLab } from './labs';
import { programView, versionDetailView, iso } from './views';

export async function listClassLabs(ctx: AppContext, actor: User, classId: string): Promise<Outcome<LabListItem[]>> {
  const cls = await authorisedClass(ctx, actor, classId, 'view');
  if (!cls.ok) return cls;
  const staff = managesClass(actor, cls.value);
  const labs = await db.listLabsOfClass(ctx.orm, classId, !staff);
  const scores = await listSubmissionScores(ctx.orm, labs.map((l) => l.id));
  const copies = staff ? new Map<string, string>() : await db.listLabCopiesOfStudent(ctx.orm, actor.id);
  return success(
    labs.map((lab) => {
      const ofLab = scores.filter((s) => s.labId === lab.id);
      return {
        id: lab.id,
        title: lab.title,
        summary: lab.summary,
        totalPoints: lab.totalPoints,
        dueAt: lab.dueAt ? iso(lab.dueAt) : null,
        latePolicy: lab.latePolicy as LatePolicy,
        publishedAt: lab.publishedAt ? iso(lab.publishedAt) : null,
        status: staff ? null : standing(ofLab.filter((s) => s.studentId === actor.id), copies.get(lab.id) ?? null),
        submissionCount: staff ? ofLab.length : null,
      };
    }),
  );
}

type ScoreRow = Awaited<ReturnType<typeof listSubmissionScores>>[number];

function standing(mine: ScoreRow[], programId: string | null): StudentLabStatus {
  const latest = mine.at(-1);
  return {
    state: latest ? latest.status : programId ? 'started' : 'not_started',
    programId,
    submissions: mine.length,
    lastSubmittedAt: latest ? iso(latest.submittedAt) : null,
    late: latest?.late ?? false,
    score: latest ? latest.score : null,
  };
}

type OpenLabResponse = z.infer<typeof OpenLabResponseSchema>;

/** The student's copy of the starter, made on the first open (idempotent, also under concurrent opens). */
export async function openLab(ctx: AppContext, actor: User, labId: string): Promise<Outcome<OpenLabResponse>> {
  const found = await authorisedLab(ctx, actor, labId, 'work');
  if (!found.ok) return found;
  const { lab } = found.value;
  const existing = await db.findLabCopy(ctx.orm, labId, actor.id);
  if (existing) return copyView(ctx, existing, false);
  const document = lab.starterDocument ?? createEmptyProgram(lab.title);
  const now = ctx.clock.now();
  const made = await insertProgram(ctx.orm, { ownerId: actor.id, authorId: actor.id, title: lab.title, labId, document, message: 'Starter of the lab', now });
  if (!(await db.insertLabCopy(ctx.orm, { labId, studentId: actor.id, programId: made.program.id, now }))) {
    // A concurrent open made the copy first: keep that one.
    await deleteProgram(ctx.orm, made.program.id);
    const winner = await db.findLabCopy(ctx.orm, labId, actor.id);
    return winner ? copyView(ctx, winner, false) : failure('internal', 'The lab copy vanished during the open');
  }
  return success({ program: programView(made.program), head: versionDetailView(made.version), created: true });
}

async function copyView(ctx: AppContext, programId: string, created: boolean): Promise<Outcome<OpenLabResponse>> {
  const program = await findProgram(ctx.orm, programId);
  const head = program ? await findVersion(ctx.orm, programId, program.headVersion) : null;
  if (!program || !head) return failure('not_found', 'Your copy of this lab is gone');
  return success({ program: programView(program), head: versionDetailView(head), created });
}

export async function getSelfCheckScript(ctx: AppContext, actor: User, labId: string): Promise<Outcome<SelfCheckScript>> {
  const found = await authorisedLab(ctx, actor, labId, 'view');
  if (!found.ok) return found;
  const run = labRun(found.value.lab.panel as LabPanel, found.value.lab.checkScript);
  if (!run.ok && run.part === 'panel') return failure('conflict', 'The lab panel is not valid; tell your instructor');
  if (!run.ok) return failure('conflict', 'The lab check script does not run; tell your instructor');
  return success(selfCheckScript(run.value.script));
}
