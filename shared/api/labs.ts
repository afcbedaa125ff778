/**
 * Labs, submissions, grading and the gradebook: request and response bodies.
 *
 * Who sees what: an instructor of the class (and an admin) gets the whole lab, script included; a
 * student gets the lab without its script (`script: null`) and runs self-checks on the script of
 * `GET /api/labs/:id/self-check-script`, which holds only the visible checks and the steps that
 * lead to them. A student's grade report is redacted (`redactReport` in `shared/checks`): hidden
 * checks are only `{ index, passed, points, hidden: true }`.
 *
 * Times are ISO 8601 strings; scores are points of the lab's `totalPoints` (two decimals at most).
 */
import { z } from 'zod';
import { INT32_MAX, ProgramSummarySchema, VersionDetailSchema, VersionNumberSchema } from './programs';

// ── Pieces of a lab ───────────────────────────────────────────────────────────────────────────

/** What happens to a submission after the due date. */
export type LatePolicyKind = 'accept' | 'penalty' | 'refuse';
export const LATE_POLICY_KINDS: readonly LatePolicyKind[] = ['accept', 'penalty', 'refuse'];

/**
 * `accept`: marked late, no deduction; `penalty`: marked late and `penaltyPercent` of the auto
 * score deducted; `refuse`: no submissions after the due date.
 */
export const LatePolicySchema = z
  .strictObject({
    kind: z.enum(['accept', 'penalty', 'refuse'], { error: 'kind is one of accept, penalty, refuse' }),
    penaltyPercent: z.number().min(0, 'a penalty is 0 to 100 %').max(100, 'a penalty is 0 to 100 %').optional(),
  })
  .refine((p) => p.kind !== 'penalty' || p.penaltyPercent !== undefined, {
    message: 'a penalty policy needs penaltyPercent (0 to 100)',
    path: ['penaltyPercent'],
  });
export type LatePolicy = z.infer<typeof LatePolicySchema>;

/** The panel a lab runs on: a built-in layout by id, or a custom layout (validated by the shared layout parser). */
export const LabPanelSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('builtIn'), id: z.string().min(1, 'name a built-in panel, e.g. reversing-conveyor') }),
    z.strictObject({ kind: z.literal('custom'), layout: z.unknown().refine((v) => v !== undefined, 'the custom panel layout is missing') }),
  ],
  { error: 'panel is { kind: "builtIn", id } or { kind: "custom", layout }' },
);
export type LabPanel = z.infer<typeof LabPanelSchema>;

/** Where a student's copy starts: an empty program, or one saved version of one of the instructor's programs. */
export const LabStarterChoiceSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('empty') }),
    z.strictObject({ kind: z.literal('program'), programId: z.uuid('not a program id'), version: VersionNumberSchema }),
  ],
  { error: 'starter is { kind: "empty" } or { kind: "program", programId, version }' },
);
export type LabStarterChoice = z.infer<typeof LabStarterChoiceSchema>;

export const LabTitleSchema = z.string().trim().min(1, 'a lab needs a title').max(200, 'a title is at most 200 characters');
export const LabSummarySchema = z.string().trim().max(300, 'a summary is at most 300 characters');
/** Markdown source; the browser renders it (marked) and sanitises it (DOMPurify). */
export const LabBriefSchema = z.string().max(100_000, 'a brief is at most 100 000 characters');
export const TotalPointsSchema = z.number().int('total points are a whole number').min(1, 'total points are at least 1').max(1000, 'total points are at most 1000');
export const DueAtSchema = z.iso
  .datetime({ offset: true, error: 'dueAt is an ISO 8601 date-time, e.g. 2026-10-01T23:59:00Z' })
  // Year 0000 parses but the database refuses it; no due date is meant before 1970 anyway.
  .refine((v) => new Date(v).getUTCFullYear() >= 1970, 'dueAt is a date from 1970 on')
  .nullable();

// ── Attachments ───────────────────────────────────────────────────────────────────────────────

/** Content types an attachment may have; checked from the content's first bytes, not its name. */
export type AttachmentType = 'image/png' | 'image/jpeg' | 'application/pdf';
export const ATTACHMENT_TYPES: readonly AttachmentType[] = ['image/png', 'image/jpeg', 'application/pdf'];
/** 10 MB, the limit. */
export const MAX_ATTACHMENT_BYTES = 10 * 1024 * 1024;

export const AttachmentSummarySchema = z.object({
  id: z.string(),
  filename: z.string(),
  contentType: z.enum(['image/png', 'image/jpeg', 'application/pdf']),
  size: z.number().int(),
  createdAt: z.string(),
  /** `GET` this path for the bytes. */
  url: z.string(),
});
export type AttachmentSummary = z.infer<typeof AttachmentSummarySchema>;
export const AttachmentListSchema = z.object({ attachments: z.array(AttachmentSummarySchema) });

// ── Lab bodies ────────────────────────────────────────────────────────────────────────────────

/** The starter as stored: where it came from and its document (null = empty program). */
export const LabStarterSchema = z.object({
  kind: z.enum(['empty', 'program', 'template']),
  programId: z.string().nullable(),
  version: z.number().int().nullable(),
  document: z.unknown().nullable(),
});

/**
 * `GET /api/labs/:id`. For a student `script` is null and `checks` tells only how many visible and
 * hidden checks the lab has.
 */
export const LabDetailSchema = z.object({
  id: z.string(),
  classId: z.string(),
  authorId: z.string(),
  title: z.string(),
  summary: z.string(),
  brief: z.string(),
  panel: LabPanelSchema,
  starter: LabStarterSchema,
  /** The whole check script (instructor and admin only). */
  script: z.unknown().nullable(),
  checks: z.object({ visible: z.number().int(), hidden: z.number().int(), maxScore: z.number().int() }),
  totalPoints: z.number().int(),
  dueAt: z.string().nullable(),
  latePolicy: LatePolicySchema,
  publishedAt: z.string().nullable(),
  /** The standard lab this was copied from, if any. */
  templateId: z.string().nullable(),
  attachments: z.array(AttachmentSummarySchema),
  demo: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type LabDetail = z.infer<typeof LabDetailSchema>;
export const LabDetailResponseSchema = z.object({ lab: LabDetailSchema });

/** A student's standing on a lab in the class list. */
export type StudentLabState = 'not_started' | 'started' | 'submitted' | 'graded' | 'returned';
export const StudentLabStatusSchema = z.object({
  state: z.enum(['not_started', 'started', 'submitted', 'graded', 'returned']),
  /** Their own copy of the starter, once opened. */
  programId: z.string().nullable(),
  submissions: z.number().int(),
  lastSubmittedAt: z.string().nullable(),
  late: z.boolean(),
  /** Score of the latest submission (the override once returned), or null. */
  score: z.number().nullable(),
});
export type StudentLabStatus = z.infer<typeof StudentLabStatusSchema>;

/** One row of `GET /api/classes/:id/labs`: students see published labs with `status`; staff see all with `submissionCount`. */
export const LabListItemSchema = z.object({
  id: z.string(),
  title: z.string(),
  summary: z.string(),
  totalPoints: z.number().int(),
  dueAt: z.string().nullable(),
  latePolicy: LatePolicySchema,
  publishedAt: z.string().nullable(),
  status: StudentLabStatusSchema.nullable(),
  submissionCount: z.number().int().nullable(),
});
export type LabListItem = z.infer<typeof LabListItemSchema>;
export const LabListSchema = z.object({ labs: z.array(LabListItemSchema) });

/** `POST /api/classes/:id/labs`. Defaults: empty brief, built-in default panel, empty starter, 100 points, no due date, accept late. */
export const CreateLabRequestSchema = z.strictObject({
  title: LabTitleSchema,
  summary: LabSummarySchema.optional(),
  brief: LabBriefSchema.optional(),
  panel: LabPanelSchema.optional(),
  starter: LabStarterChoiceSchema.optional(),
  /** A check script (docs/check-scripts.md), checked step by step and against the panel. */
  script: z.unknown().refine((v) => v !== undefined, 'a lab needs a check script'),
  totalPoints: TotalPointsSchema.optional(),
  dueAt: DueAtSchema.optional(),
  latePolicy: LatePolicySchema.optional(),
});
export type CreateLabRequest = z.infer<typeof CreateLabRequestSchema>;

/** `PATCH /api/labs/:id`: any of the fields; the script is checked again against the (new) panel. */
export const UpdateLabRequestSchema = z.strictObject({
  title: LabTitleSchema.optional(),
  summary: LabSummarySchema.optional(),
  brief: LabBriefSchema.optional(),
  panel: LabPanelSchema.optional(),
  starter: LabStarterChoiceSchema.optional(),
  script: z.unknown().optional(),
  totalPoints: TotalPointsSchema.optional(),
  dueAt: DueAtSchema.optional(),
  latePolicy: LatePolicySchema.optional(),
});
export type UpdateLabRequest = z.infer<typeof UpdateLabRequestSchema>;

/** A saved version of a program: `POST /api/labs/:id/try` and `POST /api/labs/:id/submissions`. */
export const ProgramVersionRefSchema = z.strictObject({
  programId: z.uuid('not a program id'),
  version: z
    .number({ error: 'version must be a saved version number' })
    .int('version must be a saved version number')
    .min(1, 'version must be a saved version number')
    .max(INT32_MAX, `version is at most ${INT32_MAX}`),
});
export type ProgramVersionRef = z.infer<typeof ProgramVersionRefSchema>;

// ── Grade reports (shapes of `shared/checks` GradeReport / StudentReport) ─────────────────────

const ExpectationValueSchema = z.union([z.boolean(), z.number(), z.string(), z.object({ min: z.number().optional(), max: z.number().optional() })]);

export const CheckResultSchema = z.object({
  index: z.number().int(),
  label: z.string(),
  passed: z.boolean(),
  points: z.number(),
  hidden: z.boolean(),
  atMs: z.number(),
  expected: z.record(z.string(), ExpectationValueSchema),
  actual: z.record(z.string(), z.union([z.string(), z.boolean(), z.number(), z.null()])),
  steps: z.array(z.string()),
  note: z.string().optional(),
});
/** A hidden check as a student sees it: pass or fail and points, not where it sits. */
export const HiddenCheckViewSchema = z.strictObject({ passed: z.boolean(), points: z.number(), hidden: z.literal(true) });

/** The fields of a grade report the screens use; events, trace and diagnostics pass through as they are. */
export const GradeReportSchema = z.looseObject({
  format: z.literal('rungwright.grade-report'),
  version: z.literal(1),
  panel: z.string(),
  passed: z.boolean(),
  score: z.number(),
  maxScore: z.number(),
  checks: z.array(CheckResultSchema),
  stoppedBy: z.string().nullable(),
  virtualMs: z.number(),
  scans: z.number(),
});
export const StudentReportSchema = GradeReportSchema.extend({
  checks: z.array(z.union([HiddenCheckViewSchema, CheckResultSchema])),
  redacted: z.literal(true),
});

/**
 * `POST /api/labs/:id/try`: the full report (hidden checks included) on the instructor's program;
 * `report` is null and `note` says why when grading hit the wall-clock limit.
 */
export const TryLabResponseSchema = z.object({ report: GradeReportSchema.nullable(), note: z.string().nullable() });

// ── Templates ─────────────────────────────────────────────────────────────────────────────────

export const LabTemplateSummarySchema = z.object({ id: z.string(), order: z.number().int(), title: z.string(), summary: z.string(), panel: z.string() });
export const LabTemplateListSchema = z.object({ templates: z.array(LabTemplateSummarySchema) });

/** `POST /api/classes/:id/labs/from-template`: an unpublished copy; the reference solution becomes the instructor's program. */
export const FromTemplateRequestSchema = z.strictObject({
  templateId: z.string().min(1, 'name a standard lab'),
  dueAt: DueAtSchema.optional(),
  totalPoints: TotalPointsSchema.optional(),
  latePolicy: LatePolicySchema.optional(),
});
export const FromTemplateResponseSchema = z.object({ lab: LabDetailSchema, solution: ProgramSummarySchema });

// ── Student: open, self-check, submit ─────────────────────────────────────────────────────────

/** `POST /api/labs/:id/open`: the student's own copy (made on first open; `created` says whether now). */
export const OpenLabResponseSchema = z.object({ program: ProgramSummarySchema, head: VersionDetailSchema, created: z.boolean() });

/**
 * `GET /api/labs/:id/self-check-script`: the student's script (`studentScript` in
 * `shared/checks`): every step up to the last visible check, without the hidden checks' expect
 * steps (an expect step only reads, so the visible checks see the same states as in grading) and
 * with two waits a hidden check kept apart joined into one, so nothing shows where a hidden check
 * sat. Its step numbers are the ones the student's grade reports use.
 */
export const SelfCheckScriptSchema = z.object({
  script: z.unknown(),
  withheld: z.object({ hiddenChecks: z.number().int(), hiddenPoints: z.number().int() }),
});
export type SelfCheckScript = z.infer<typeof SelfCheckScriptSchema>;

export type SubmissionStatus = 'submitted' | 'graded' | 'returned';
export const SUBMISSION_STATUSES: readonly SubmissionStatus[] = ['submitted', 'graded', 'returned'];
export const SubmissionStatusSchema = z.enum(['submitted', 'graded', 'returned']);

/** Scores of one submission, in points of the lab's total. */
const submissionScores = {
  /** From the report, scaled to `totalPoints`, after any late penalty. Null while not graded. */
  autoScore: z.number().nullable(),
  /** The override when there is one, else the auto score. */
  finalScore: z.number().nullable(),
  totalPoints: z.number().int(),
  /** The late penalty applied to the auto score, in %. */
  penaltyPercent: z.number(),
};

/** A submission as its student sees it (`GET /api/labs/:id/submissions/mine`, the submit answer). */
export const StudentSubmissionSchema = z.object({
  id: z.string(),
  labId: z.string(),
  /** Null once the student deleted the program; the submitted document is kept with the submission. */
  programId: z.string().nullable(),
  version: z.number().int(),
  submittedAt: z.string(),
  late: z.boolean(),
  status: SubmissionStatusSchema,
  ...submissionScores,
  /** Why grading could not finish normally (a limit, the wall-clock limit), or null. */
  gradingNote: z.string().nullable(),
  /** The instructor's feedback and override reason, shown once returned. */
  feedback: z.string().nullable(),
  overrideReason: z.string().nullable(),
  returnedAt: z.string().nullable(),
  report: StudentReportSchema.nullable(),
});
export type StudentSubmission = z.infer<typeof StudentSubmissionSchema>;
export const StudentSubmissionResponseSchema = z.object({ submission: StudentSubmissionSchema });
export const StudentSubmissionListSchema = z.object({ submissions: z.array(StudentSubmissionSchema) });

// ── Instructor review ─────────────────────────────────────────────────────────────────────────

export const SubmissionStudentSchema = z.object({ id: z.string(), name: z.string(), email: z.string() });

/** One row of `GET /api/labs/:id/submissions`. */
export const SubmissionRowSchema = z.object({
  id: z.string(),
  student: SubmissionStudentSchema,
  submittedAt: z.string(),
  late: z.boolean(),
  status: SubmissionStatusSchema,
  version: z.number().int(),
  /** 1 for a student's first submission to the lab, 2 for the next … */
  attempt: z.number().int(),
  /** True on the student's newest submission. */
  latest: z.boolean(),
  ...submissionScores,
  gradingNote: z.string().nullable(),
});
export type SubmissionRow = z.infer<typeof SubmissionRowSchema>;
export const SubmissionRowListSchema = z.object({ submissions: z.array(SubmissionRowSchema) });

export type SubmissionSortKey = 'submittedAt' | 'student' | 'autoScore' | 'finalScore' | 'status';
/** Query of `GET /api/labs/:id/submissions`. */
export const SubmissionListQuerySchema = z.object({
  status: SubmissionStatusSchema.optional(),
  late: z.enum(['true', 'false'], { error: 'late is true or false' }).transform((v) => v === 'true').optional(),
  /** Part of the student's name or e-mail, any case. */
  student: z.string().max(200).optional(),
  /** Only each student's newest submission. */
  latest: z.enum(['true', 'false'], { error: 'latest is true or false' }).transform((v) => v === 'true').optional(),
  sort: z.enum(['submittedAt', 'student', 'autoScore', 'finalScore', 'status'], { error: 'sort is one of submittedAt, student, autoScore, finalScore, status' }).default('submittedAt'),
  order: z.enum(['asc', 'desc'], { error: 'order is asc or desc' }).default('desc'),
});
export type SubmissionListQuery = z.infer<typeof SubmissionListQuerySchema>;

/** A report that was replaced by a regrade. */
export const GradeHistoryEntrySchema = z.object({
  gradedAt: z.string(),
  autoScore: z.number().nullable(),
  gradingNote: z.string().nullable(),
  report: GradeReportSchema.nullable(),
});

/** `GET /api/submissions/:id` (instructor, admin): the full report, the exact version's document, history. */
export const SubmissionDetailSchema = SubmissionRowSchema.extend({
  labId: z.string(),
  programId: z.string().nullable(),
  report: GradeReportSchema.nullable(),
  program: VersionDetailSchema,
  overrideScore: z.number().nullable(),
  overrideReason: z.string().nullable(),
  feedback: z.string().nullable(),
  returnedAt: z.string().nullable(),
  gradedAt: z.string().nullable(),
  history: z.array(GradeHistoryEntrySchema),
});
export type SubmissionDetail = z.infer<typeof SubmissionDetailSchema>;
export const SubmissionDetailResponseSchema = z.object({ submission: SubmissionDetailSchema });

/** `POST /api/submissions/:id/override`: a final score with the reason; `score: null` removes the override. */
export const OverrideScoreRequestSchema = z.strictObject({
  score: z.number({ error: 'score is a number of points or null' }).min(0, 'a score is at least 0').nullable(),
  reason: z.string().trim().min(1, 'say why the score is changed').max(1000, 'a reason is at most 1000 characters'),
});
export type OverrideScoreRequest = z.infer<typeof OverrideScoreRequestSchema>;

/** `PUT /api/submissions/:id/feedback`. */
export const FeedbackRequestSchema = z.strictObject({ feedback: z.string().max(10_000, 'feedback is at most 10 000 characters') });

/** `POST /api/submissions/:id/return`: optional last feedback, then status `returned` and an e-mail to the student. */
export const ReturnSubmissionRequestSchema = z.strictObject({ feedback: z.string().max(10_000, 'feedback is at most 10 000 characters').optional() });

/** `POST /api/labs/:id/regrade`: every submission graded again with the current script; the old reports go to history. */
export const RegradeResponseSchema = z.object({ regraded: z.number().int(), limited: z.number().int() });

// ── Gradebook ─────────────────────────────────────────────────────────────────────────────────

export const GradebookLabSchema = z.object({ id: z.string(), title: z.string(), totalPoints: z.number().int(), dueAt: z.string().nullable(), published: z.boolean() });
/** One student × lab: the final score of the newest submission, or null when none. */
export const GradebookCellSchema = z.object({
  labId: z.string(),
  submissionId: z.string().nullable(),
  finalScore: z.number().nullable(),
  status: SubmissionStatusSchema.nullable(),
  late: z.boolean(),
});
export const GradebookRowSchema = z.object({
  student: SubmissionStudentSchema,
  cells: z.array(GradebookCellSchema),
  /** Sum of the final scores, and of the labs' total points. */
  total: z.number(),
  possible: z.number().int(),
});
/** `GET /api/classes/:id/gradebook`: `cells` are in the order of `labs`. CSV: `GET /api/classes/:id/gradebook.csv`. */
export const GradebookSchema = z.object({
  class: z.object({ id: z.string(), name: z.string(), term: z.string() }),
  labs: z.array(GradebookLabSchema),
  rows: z.array(GradebookRowSchema),
});
export type Gradebook = z.infer<typeof GradebookSchema>;
