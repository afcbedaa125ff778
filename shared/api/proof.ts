/**
 * A program's proof sheet: the properties its owner asked the prover to decide, and the checks they
 * kept from counterexamples ("Save as check"), stored on the server beside the program so they are
 * there on the next visit and on another computer. Only the program's owner reads or writes it.
 */
import { z } from 'zod';
import { CheckScriptSchema } from '../checks/script';
import { PropertySchema } from '../proof/property';

export const MAX_SHEET_PROPERTIES = 100;
export const MAX_SAVED_CHECKS = 50;

/** A check kept from a counterexample or witness: a check script that reproduces it. */
export const SavedCheckSchema = z.strictObject({
  label: z.string().trim().min(1, 'a saved check needs a label').max(200, 'a label has at most 200 characters'),
  script: CheckScriptSchema,
});
export type SavedCheck = z.infer<typeof SavedCheckSchema>;

/** `PUT /api/programs/:id/proof` body and the `proof` of every answer. */
export const ProofSheetSchema = z.strictObject({
  properties: z.array(PropertySchema).max(MAX_SHEET_PROPERTIES, `at most ${MAX_SHEET_PROPERTIES} properties`),
  checks: z.array(SavedCheckSchema).max(MAX_SAVED_CHECKS, `at most ${MAX_SAVED_CHECKS} saved checks`),
});
export type ProofSheet = z.infer<typeof ProofSheetSchema>;

/** `GET` and `PUT /api/programs/:id/proof` answer `{ proof }`; a program without one has empty lists. */
export const ProofSheetResponseSchema = z.object({ proof: ProofSheetSchema, updatedAt: z.string().nullable() });
export type ProofSheetResponse = z.infer<typeof ProofSheetResponseSchema>;
