/**
 * The API's error body and the one table of error codes (STYLE.md point 11): the server picks the
 * HTTP status from it, the client picks its wording from the same code.
 */
import { z } from 'zod';

/** Every error code the API answers with. */
export const ApiErrorCodeSchema = z.enum([
  'bad_json',
  'validation',
  'invalid_document',
  'unauthenticated',
  'bad_credentials',
  'forbidden',
  'bad_origin',
  'not_found',
  'conflict',
  'version_conflict',
  'payload_too_large',
  'unsupported_media_type',
  'rate_limited',
  'processing_limit',
  'mail_disabled',
  'unknown_host',
  'internal',
]);
export type ApiErrorCode = z.infer<typeof ApiErrorCodeSchema>;

/** The HTTP status of each code. */
export const API_ERROR_STATUS = {
  bad_json: 400,
  validation: 400,
  invalid_document: 422,
  unauthenticated: 401,
  bad_credentials: 401,
  forbidden: 403,
  bad_origin: 403,
  not_found: 404,
  conflict: 409,
  version_conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  rate_limited: 429,
  processing_limit: 422,
  mail_disabled: 404,
  unknown_host: 421,
  internal: 500,
} as const satisfies Record<ApiErrorCode, number>;

/** A sentence the UI can show when the server's own message is not wanted. */
export const API_ERROR_SUMMARY = {
  bad_json: 'The request body is not valid JSON.',
  validation: 'Some fields are missing or wrong.',
  invalid_document: 'The program document has errors; nothing was saved.',
  unauthenticated: 'Please sign in.',
  bad_credentials: 'The e-mail or password is wrong.',
  forbidden: 'You do not have access to this.',
  bad_origin: 'The request did not come from this site.',
  not_found: 'Not found.',
  conflict: 'That conflicts with what is already there.',
  version_conflict: 'Someone saved a newer version first.',
  payload_too_large: 'The upload is too large.',
  unsupported_media_type: 'That kind of content is not accepted here.',
  rate_limited: 'Too many attempts; wait a few minutes and try again.',
  processing_limit: 'That is too large to process in the time allowed; try a smaller program.',
  mail_disabled: 'The local mail box is off because real mail is configured.',
  unknown_host: 'This server does not answer to that host name.',
  internal: 'Something went wrong on the server.',
} as const satisfies Record<ApiErrorCode, string>;

/** The body of every error answer: `{ error: { code, message, fields?, details? } }`. */
export const ApiErrorBodySchema = z.object({
  error: z.object({
    code: ApiErrorCodeSchema,
    message: z.string(),
    /** Field path (dotted, e.g. `document.rungs.0.id`) → what is wrong with it. */
    fields: z.record(z.string(), z.string()).optional(),
    /** Extra data for the code, e.g. the current head on `version_conflict`, diagnostics on `invalid_document`. */
    details: z.unknown().optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>;
