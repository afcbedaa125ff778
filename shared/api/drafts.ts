/**
 * Drafts: the editor's unsaved document kept on the server per user and program, a few seconds
 * after the last edit. A draft is never a version: it is offered back when the program is opened
 * again (if it is newer than the head), and a saved version clears it.
 */
import { z } from 'zod';

/** `PUT /api/programs/:id/draft`: the document on screen and the version the edit started from. */
export const SaveDraftRequestSchema = z.object({
  baseVersion: z.number({ error: 'baseVersion must be the version number the edit started from' }).int().min(1, 'baseVersion must be a version number'),
  document: z.unknown().refine((v) => v !== undefined, 'the program document is missing'),
});
export type SaveDraftRequest = z.infer<typeof SaveDraftRequestSchema>;

/** A draft as the API gives it (the document is a `shared/ladder` Program, checked by the client with its schema). */
export const DraftSchema = z.object({
  programId: z.string(),
  baseVersion: z.number().int(),
  document: z.unknown(),
  /** ISO time of the last edit kept. */
  updatedAt: z.string(),
});
export type Draft = z.infer<typeof DraftSchema>;

/** `GET` and `PUT` answer `{ draft }`; `GET` gives `null` when there is none. */
export const DraftResponseSchema = z.object({ draft: DraftSchema.nullable() });
export type DraftResponse = z.infer<typeof DraftResponseSchema>;
