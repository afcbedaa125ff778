/**
 * A form's messages under its fields, for naive-ui's `NFormItem` (`feedback` and
 * `validation-status`). A form checks its fields with the shared zod schema before sending, then
 * shows a refusal from the server that names fields the same way; a refusal that names none is
 * the form's to show as a whole (`fromFailure` answers false).
 */
import { ref } from 'vue';
import type { ZodType } from 'zod';
import { ApiFailure } from '@/api/http';

export function useFieldErrors() {
  const fieldErrors = ref<Record<string, string>>({});

  const status = (field: string): 'error' | undefined => (fieldErrors.value[field] ? 'error' : undefined);

  /** The parsed value, or null with each field's first message shown under it. */
  function check<T>(schema: ZodType<T>, value: unknown): T | null {
    const parsed = schema.safeParse(value);
    if (parsed.success) {
      fieldErrors.value = {};
      return parsed.data;
    }
    const messages: Record<string, string> = {};
    for (const issue of parsed.error.issues) messages[String(issue.path[0])] ??= issue.message;
    fieldErrors.value = messages;
    return null;
  }

  /** Shows a server refusal's field messages; true when it named at least one field. */
  function fromFailure(failure: unknown): boolean {
    fieldErrors.value = failure instanceof ApiFailure ? failure.fields : {};
    return Object.keys(fieldErrors.value).length > 0;
  }

  function clear(): void {
    fieldErrors.value = {};
  }

  return { fieldErrors, status, check, fromFailure, clear };
}
