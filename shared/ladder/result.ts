/**
 * The outcome of parsing something a user typed: a value, or a message that says what is wrong.
 * User mistakes are returned this way, never thrown.
 */
export type Result<T> = { ok: true; value: T } | { ok: false; error: string };

/** A successful result. */
export function ok<T>(value: T): Result<T> {
  return { ok: true, value };
}

/** A failed result carrying a message for the user. */
export function fail<T = never>(error: string): Result<T> {
  return { ok: false, error };
}
