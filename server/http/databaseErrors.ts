/**
 * The safety net for input that got past validation and was refused by PostgreSQL: the SQLSTATE
 * codes a request's data can cause become a 4xx with a plain message. Validation should have
 * caught each of them first (the fuzz test in `tests/api/fuzz.test.ts` looks for any that it did
 * not); a code not listed here is the server's own fault and stays a 500.
 *
 * Codes from the PostgreSQL documentation, appendix A "PostgreSQL Error Codes".
 */
import type { Failure } from './failure';

/** The SQLSTATE of a database error, looking through wrappers (Drizzle puts the driver's error in `cause`). */
function sqlStateOf(err: unknown): { code: string; detail?: string } | null {
  for (let at: unknown = err, hops = 0; at && typeof at === 'object' && hops < 5; at = (at as { cause?: unknown }).cause, hops += 1) {
    const code = (at as { code?: unknown }).code;
    if (typeof code === 'string' && /^[0-9][0-9A-Z]{4}$/.test(code)) return { code, detail: (at as { detail?: string }).detail };
  }
  return null;
}

/** `lab_id` → `labId`, for naming the field a foreign key refused. */
const camel = (column: string): string => column.replace(/_([a-z])/g, (_m, c: string) => c.toUpperCase());

export function failureFromDatabase(err: unknown): Failure | null {
  const state = sqlStateOf(err);
  if (!state) return null;
  switch (state.code) {
    case '23503': {
      // foreign_key_violation: "Key (lab_id)=(…) is not present in table "labs"."
      const column = /Key \(([a-z_]+)\)/.exec(state.detail ?? '')?.[1];
      const field = column ? camel(column) : null;
      return {
        code: 'not_found',
        message: field ? `${field}: nothing with that id exists (or it was just deleted)` : 'Something this request refers to does not exist (or was just deleted)',
        ...(field ? { fields: { [field]: 'does not exist' } } : {}),
      };
    }
    case '23505': // unique_violation: two requests raced for the same name or slot
      return { code: 'conflict', message: 'That conflicts with something saved at the same moment; reload and try again' };
    case '22021': // character_not_in_repertoire (NUL in text)
    case '22P05': // untranslatable_character (\u0000 in jsonb)
      return { code: 'validation', message: 'The request holds a character that cannot be stored (the NUL character, U+0000)' };
    case '22003': // numeric_value_out_of_range
      return { code: 'validation', message: 'A number in the request is out of range' };
    case '22P02': // invalid_text_representation
      return { code: 'validation', message: 'A value in the request has the wrong form (e.g. an id that is not a UUID)' };
    case '22007': // invalid_datetime_format
    case '22008': // datetime_field_overflow
    case '22009': // invalid_time_zone_displacement_value
      return { code: 'validation', message: 'A date in the request is out of range' };
    case '22001': // string_data_right_truncation
      return { code: 'validation', message: 'A text in the request is too long' };
    case '54001': // statement_too_complex (e.g. nesting too deep for jsonb)
      return { code: 'validation', message: 'The request is nested too deeply to store' };
    default:
      return null;
  }
}
