/**
 * An instructor's week: the class overview (every lab's standing in counts), every enrolled
 * student's standing on one lab, returning every graded submission at once, and similar
 * submissions. All of it is the class's own instructor's (student work); admins do not read it.
 */
import { z } from 'zod';
import { SubmissionStudentSchema } from './labs';

/** Where a student is on a lab: nothing yet, a copy opened, a submission waiting, or returned. */
export type LabStanding = 'not_started' | 'in_progress' | 'submitted' | 'returned';
export const LAB_STANDINGS: readonly LabStanding[] = ['not_started', 'in_progress', 'submitted', 'returned'];
export const LabStandingSchema = z.enum(['not_started', 'in_progress', 'submitted', 'returned']);

/** One lab of `GET /api/classes/:id/overview`. */
export const OverviewLabSchema = z.object({
  id: z.string(),
  title: z.string(),
  dueAt: z.string().nullable(),
  published: z.boolean(),
  totalPoints: z.number().int(),
  /** Students by standing (each student counted once, by their newest submission). */
  counts: z.object({
    not_started: z.number().int(),
    in_progress: z.number().int(),
    submitted: z.number().int(),
    returned: z.number().int(),
    /** Of those who submitted, how many did so late (newest submission). */
    late: z.number().int(),
  }),
  /** Mean final score of the newest scored submissions, or null when none has a score. */
  average: z.number().nullable(),
  /** Newest submissions not returned yet: what is waiting for the instructor. */
  needsGrading: z.number().int(),
});
export type OverviewLab = z.infer<typeof OverviewLabSchema>;

/** `GET /api/classes/:id/overview`: labs in due order (undated last). */
export const ClassOverviewSchema = z.object({
  class: z.object({ id: z.string(), name: z.string(), term: z.string() }),
  students: z.number().int(),
  labs: z.array(OverviewLabSchema),
});
export type ClassOverview = z.infer<typeof ClassOverviewSchema>;

/** One enrolled student on one lab (`GET /api/labs/:id/students`). */
export const LabStudentRowSchema = z.object({
  student: SubmissionStudentSchema,
  standing: LabStandingSchema,
  /** The newest submission, if any. */
  submissionId: z.string().nullable(),
  /** `submitted` or `graded` (machine-graded, waiting for review) or `returned`; null without a submission. */
  status: z.enum(['submitted', 'graded', 'returned']).nullable(),
  submissions: z.number().int(),
  submittedAt: z.string().nullable(),
  late: z.boolean(),
  /** Whole days (started) after the due date; 0 when on time or not submitted. */
  lateDays: z.number().int(),
  penaltyPercent: z.number(),
  finalScore: z.number().nullable(),
  totalPoints: z.number().int(),
});
export type LabStudentRow = z.infer<typeof LabStudentRowSchema>;
export const LabStudentListSchema = z.object({ students: z.array(LabStudentRowSchema) });

/** `POST /api/labs/:id/return-graded`: one optional note added to every returned submission's feedback. */
export const ReturnGradedRequestSchema = z.strictObject({
  note: z.string().trim().max(10_000, 'a note is at most 10 000 characters').optional(),
});
export type ReturnGradedRequest = z.infer<typeof ReturnGradedRequestSchema>;
export const ReturnGradedResponseSchema = z.object({ returned: z.number().int() });

/** One pair of `GET /api/labs/:id/similar`: the newest submissions of two students. */
export const SimilarPairSchema = z.object({
  a: z.object({ submissionId: z.string(), student: SubmissionStudentSchema }),
  b: z.object({ submissionId: z.string(), student: SubmissionStudentSchema }),
  /** 0..1, the structural likeness beyond the starter. */
  score: z.number(),
  /** Rungs of each that have a twin in the other (beyond the starter). */
  matchedRungs: z.number().int(),
});
export type SimilarPair = z.infer<typeof SimilarPairSchema>;
export const SimilarListSchema = z.object({
  /** The score from which a pair is listed. */
  threshold: z.number(),
  /** Submissions compared (each student's newest). */
  compared: z.number().int(),
  pairs: z.array(SimilarPairSchema),
});
export type SimilarList = z.infer<typeof SimilarListSchema>;

/** A program side by side: each rung's one-line text form and whether it has a twin in the other. */
export const SideProgramSchema = z.object({
  submissionId: z.string(),
  student: SubmissionStudentSchema,
  version: z.number().int(),
  rungs: z.array(z.object({ comment: z.string(), text: z.string(), matched: z.boolean() })),
});
/** `GET /api/labs/:id/similar/:a/:b`. */
export const SideBySideSchema = z.object({ score: z.number(), a: SideProgramSchema, b: SideProgramSchema });
export type SideBySide = z.infer<typeof SideBySideSchema>;
