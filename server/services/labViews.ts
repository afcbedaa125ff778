/** Lab and submission rows → the API's shapes (`shared/api/labs.ts`). */
import type { AttachmentSummary, LabDetail, LabPanel, LatePolicy, StudentSubmission, SubmissionRow } from '@shared/api';
import { redactReport, type GradeReport } from '@shared/checks';
import type { AttachmentRecord, LabRecord } from '../db/labs';
import type { SubmissionRecord } from '../db/submissions';
import type { CheckCounts } from './labChecks';
import { iso } from './views';

const isoOrNull = (d: Date | null): string | null => (d ? iso(d) : null);

export function attachmentView(a: AttachmentRecord): AttachmentSummary {
  return { id: a.id, filename: a.filename, contentType: a.contentType, size: a.size, createdAt: iso(a.createdAt), url: `/api/labs/${a.labId}/attachments/${a.id}` };
}

/** `staff` sees the script; a student gets `script: null`. */
export function labView(lab: LabRecord, counts: CheckCounts, attachments: AttachmentRecord[], staff: boolean): LabDetail {
  return {
    id: lab.id,
    classId: lab.classId,
    authorId: lab.authorId,
    title: lab.title,
    summary: lab.summary,
    brief: lab.brief,
    panel: lab.panel as LabPanel,
    starter: { kind: lab.starterKind, programId: lab.starterProgramId, version: lab.starterVersion, document: lab.starterDocument ?? null },
    script: staff ? lab.checkScript : null,
    checks: counts,
    totalPoints: lab.totalPoints,
    dueAt: isoOrNull(lab.dueAt),
    latePolicy: lab.latePolicy as LatePolicy,
    publishedAt: isoOrNull(lab.publishedAt),
    templateId: lab.templateId,
    attachments: attachments.map(attachmentView),
    demo: lab.demo,
    createdAt: iso(lab.createdAt),
    updatedAt: iso(lab.updatedAt ?? lab.createdAt),
  };
}

function scores(s: SubmissionRecord, totalPoints: number) {
  return { autoScore: s.autoScore, finalScore: s.score, totalPoints, penaltyPercent: s.penaltyPercent };
}

/** What the student sees: the redacted report; feedback and any override once returned. */
export function studentSubmissionView(s: SubmissionRecord, totalPoints: number): StudentSubmission {
  const returned = s.status === 'returned';
  const report = s.report as GradeReport | null;
  return {
    id: s.id,
    labId: s.labId,
    programId: s.programId,
    version: s.versionNumber,
    submittedAt: iso(s.submittedAt),
    late: s.late,
    status: s.status,
    ...scores(s, totalPoints),
    // Before the return an override is the instructor's work in progress: show the auto score.
    finalScore: returned ? s.score : s.autoScore,
    gradingNote: s.gradingNote,
    feedback: returned ? s.feedback : null,
    overrideReason: returned ? s.overrideReason : null,
    returnedAt: isoOrNull(s.returnedAt),
    report: report ? (redactReport(report) as unknown as StudentSubmission["report"]) : null,
  };
}

export function submissionRowView(s: SubmissionRecord, student: { id: string; name: string; email: string }, totalPoints: number, attempt: number, latest: boolean): SubmissionRow {
  return {
    id: s.id,
    student,
    submittedAt: iso(s.submittedAt),
    late: s.late,
    status: s.status,
    version: s.versionNumber,
    attempt,
    latest,
    ...scores(s, totalPoints),
    gradingNote: s.gradingNote,
  };
}
