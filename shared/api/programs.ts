/** Programs and their immutable versions: request and response bodies. */
import { z } from 'zod';

/**
 * The largest value of a PostgreSQL `integer` column (2^31 − 1). Every whole number a request
 * carries to such a column is bounded by it, so a huge one is refused with its field named instead
 * of failing at the database.
 */
export const INT32_MAX = 2_147_483_647;

/** A saved version's number (1, 2, …), as sent in a body. */
export const VersionNumberSchema = z
  .number({ error: 'a version number is a whole number from 1' })
  .int('a version number is a whole number from 1')
  .min(1, 'a version number is a whole number from 1')
  .max(INT32_MAX, `a version number is at most ${INT32_MAX}`);

/** A program as listed: no document. */
export const ProgramSummarySchema = z.object({
  id: z.string(),
  ownerId: z.string(),
  title: z.string(),
  labId: z.string().nullable(),
  headVersion: z.number().int(),
  demo: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type ProgramSummary = z.infer<typeof ProgramSummarySchema>;

export const VersionSummarySchema = z.object({
  number: z.number().int(),
  message: z.string(),
  authorId: z.string(),
  createdAt: z.string(),
});
export type VersionSummary = z.infer<typeof VersionSummarySchema>;

/** A version with its document (a `shared/ladder` Program, checked with its schema by the client). */
export const VersionDetailSchema = VersionSummarySchema.extend({ document: z.unknown() });
export type VersionDetail = z.infer<typeof VersionDetailSchema>;

/** `GET /api/programs/:id`: the program and its head version. */
export const ProgramDetailSchema = z.object({ program: ProgramSummarySchema, head: VersionDetailSchema });
export type ProgramDetail = z.infer<typeof ProgramDetailSchema>;

/** A row of "My programs": the summary and, for a lab's program, the lab's title (to name and link it). */
export const ProgramListItemSchema = ProgramSummarySchema.extend({ labTitle: z.string().nullable() });
export type ProgramListItem = z.infer<typeof ProgramListItemSchema>;

export const ProgramListSchema = z.object({ programs: z.array(ProgramListItemSchema) });
export const VersionListSchema = z.object({ versions: z.array(VersionSummarySchema) });

export const ProgramTitleSchema = z.string().trim().min(1, 'a title is needed').max(200, 'a title is at most 200 characters');
export const VersionMessageSchema = z.string().trim().max(500, 'a message is at most 500 characters');

/** `POST /api/programs`: a new program; without a document it starts empty. */
export const CreateProgramRequestSchema = z.object({
  title: ProgramTitleSchema,
  document: z.unknown().optional(),
  message: VersionMessageSchema.optional(),
  labId: z.uuid('not a lab id').optional(),
});
export type CreateProgramRequest = z.infer<typeof CreateProgramRequestSchema>;

export const RenameProgramRequestSchema = z.object({ title: ProgramTitleSchema });

/** `POST /api/programs/:id/versions`: a save, based on the version the editor loaded. */
export const SaveVersionRequestSchema = z.object({
  baseVersion: z
    .number({ error: 'baseVersion must be the version number the edit started from' })
    .int('baseVersion must be the version number the edit started from')
    .min(1, 'baseVersion must be the version number the edit started from')
    .max(INT32_MAX, `baseVersion is at most ${INT32_MAX}`),
  document: z.unknown().refine((v) => v !== undefined, 'the program document is missing'),
  message: VersionMessageSchema.default(''),
});
export type SaveVersionRequest = z.infer<typeof SaveVersionRequestSchema>;

/** `POST /api/programs/:id/restore`: a new version copying an old one. */
export const RestoreVersionRequestSchema = z.object({
  version: VersionNumberSchema,
  baseVersion: VersionNumberSchema,
  message: VersionMessageSchema.optional(),
});
export type RestoreVersionRequest = z.infer<typeof RestoreVersionRequestSchema>;

/** `details` of a `version_conflict` (409): the head that moved on. */
export const VersionConflictDetailsSchema = z.object({ head: VersionSummarySchema });

export const DiffQuerySchema = z.object({
  from: z.coerce.number().int('from must be a version number').min(1, 'from must be a version number').max(INT32_MAX, 'from must be a version number'),
  to: z.coerce.number().int('to must be a version number').min(1, 'to must be a version number').max(INT32_MAX, 'to must be a version number'),
});

/** One rung's change between two versions, with the rung's one-line text form and comments. */
export const RungDiffSchema = z.object({
  kind: z.enum(['added', 'removed', 'changed', 'same']),
  rungId: z.string(),
  before: z.string().optional(),
  after: z.string().optional(),
  beforeComment: z.string().optional(),
  afterComment: z.string().optional(),
  /** For a changed rung: whether its logic, its comment or both changed. */
  changedParts: z.array(z.enum(['logic', 'comment'])).optional(),
});
export type RungDiffView = z.infer<typeof RungDiffSchema>;

export const DiffResponseSchema = z.object({ from: z.number(), to: z.number(), rungs: z.array(RungDiffSchema) });
export type DiffResponse = z.infer<typeof DiffResponseSchema>;

export const ExportQuerySchema = z.object({ format: z.enum(['json', 'plcopen']).default('json') });

/** `POST /api/programs/import` answer. */
export const ImportResponseSchema = z.object({ program: ProgramSummarySchema, warnings: z.array(z.string()) });

export const OwnerQuerySchema = z.object({ ownerId: z.uuid('not a user id').optional() });
