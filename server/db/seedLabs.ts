/**
 * Demo labs (seed): the standard labs published in the demo class, and three demo submissions to
 * the forward/reverse lab — one correct, one with the interlocks missing, one late. Graded
 * in-process with the same `gradeJob` the worker runs (deterministic, so the same report).
 */
import { FORWARD_REVERSE, STANDARD_LABS } from '@shared/labs';
import { builtInPanel } from '@shared/field/panels';
import type { Program } from '@shared/ladder/schema';
import type { Db } from './client';
import type { User } from './users';
import { insertLab, insertLabCopy, type LabRecord } from './labs';
import { insertProgram } from './programs';
import { insertSubmission } from './submissions';
import { gradeJob } from '../grading/gradeJob';
import { MISSING_INTERLOCK_DEMO } from './demoPrograms';

const DAY_MS = 24 * 60 * 60 * 1000;

export async function seedDemoLabs(db: Db, now: Date, instructor: User, classId: string, students: User[]): Promise<void> {
  const labs: LabRecord[] = [];
  for (const [i, template] of STANDARD_LABS.entries()) {
    const maxScore = (template.script.steps as { expect?: unknown; points?: number }[]).reduce((sum, s) => sum + (s.expect ? (s.points ?? 1) : 0), 0);
    labs.push(
      await insertLab(db, {
        classId,
        authorId: instructor.id,
        title: template.title,
        summary: template.summary,
        brief: template.brief,
        panel: { kind: 'builtIn', id: template.panel },
        starterKind: 'template',
        starterDocument: template.starter,
        checkScript: template.script,
        totalPoints: maxScore,
        // One lab a week; the forward/reverse lab's due date has passed so one demo submission is late.
        dueAt: template.id === FORWARD_REVERSE.id ? new Date(now.getTime() - DAY_MS) : new Date(now.getTime() + (i + 1) * 7 * DAY_MS),
        latePolicy: { kind: 'penalty', penaltyPercent: 10 },
        templateId: template.id,
        demo: true,
        publishedAt: now,
        createdAt: new Date(now.getTime() + i),
        updatedAt: now,
      }),
    );
  }
  const lab = labs.find((l) => l.templateId === FORWARD_REVERSE.id)!;
  const panel = builtInPanel(FORWARD_REVERSE.panel)!;
  const [ana, tom, priya] = students;
  const cases: { student: User; program: Program; title: string; submittedAt: Date }[] = [
    { student: ana, program: FORWARD_REVERSE.solution, title: 'Forward/reverse (demo)', submittedAt: new Date(now.getTime() - 2 * DAY_MS) },
    { student: tom, program: MISSING_INTERLOCK_DEMO, title: 'Forward/reverse, no interlock (demo)', submittedAt: new Date(now.getTime() - 2 * DAY_MS) },
    { student: priya, program: FORWARD_REVERSE.solution, title: 'Forward/reverse, late (demo)', submittedAt: now },
  ];
  for (const c of cases) {
    const made = await insertProgram(db, { ownerId: c.student.id, authorId: c.student.id, title: c.title, labId: lab.id, demo: true, document: c.program, message: 'Submitted (demo)', now });
    await insertLabCopy(db, { labId: lab.id, studentId: c.student.id, programId: made.program.id, now });
    const late = lab.dueAt !== null && c.submittedAt > lab.dueAt;
    const penaltyPercent = late ? 10 : 0;
    const { report, note } = gradeJob({ program: c.program, panel, script: lab.checkScript });
    const fraction = report && report.maxScore > 0 ? report.score / report.maxScore : 0;
    const autoScore = Math.round(fraction * lab.totalPoints * (1 - penaltyPercent / 100) * 100) / 100;
    await insertSubmission(db, {
      labId: lab.id,
      studentId: c.student.id,
      programId: made.program.id,
      versionNumber: 1,
      document: c.program,
      status: 'graded',
      late,
      penaltyPercent,
      report,
      gradingNote: note,
      autoScore,
      score: autoScore,
      submittedAt: c.submittedAt,
      gradedAt: c.submittedAt,
    });
  }
}
