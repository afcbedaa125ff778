/**
 * Expected failures (a user's mistake, a missing row, a conflict) travel as values: services return
 * an `Outcome`, routes turn a failure into the JSON error body. `ApiError` exists only to hand a
 * failure to the error middleware from places that cannot return (middleware).
 */
import type { ZodError } from 'zod';
import type { ApiErrorCode } from '@shared/api/errors';

/** A failure with everything the error body needs. */
export interface Failure {
  code: ApiErrorCode;
  message: string;
  fields?: Record<string, string>;
  details?: unknown;
}

/** What a service returns: the value, or the failure to report. */
export type Outcome<T> = { ok: true; value: T } | { ok: false; failure: Failure };

export const success = <T>(value: T): Outcome<T> => ({ ok: true, value });

export const failure = (
  code: ApiErrorCode,
  message: string,
  extra: { fields?: Record<string, string>; details?: unknown } = {},
): { ok: false; failure: Failure } => ({ ok: false, failure: { code, message, ...extra } });

/** A failure thrown from middleware; the error middleware answers it like any other. */
export class ApiError extends Error {
  constructor(readonly failure: Failure) {
    super(failure.message);
  }
}

/** Turns zod issues into `{ "field.path": "message" }`, the first message per field. */
export function fieldsFromZod(error: ZodError, prefix = ''): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || '(body)';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** One sentence naming the bad fields, for the `message` of a validation error. */
export function describeFields(fields: Record<string, string>): string {
  return Object.entries(fields)
    .slice(0, 5)
    .map(([field, message]) => `${field}: ${message}`)
    .join('; ');
}
