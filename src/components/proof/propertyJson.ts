/**
 * The advanced field: a property typed as JSON, read live with `PropertySchema`. Every message
 * says what is wrong and where ("line 2, column 5: …", "never.%QX1: …"), and the text is only
 * ever parsed as data.
 */
import { AfterPropertySchema, AlwaysPropertySchema, NeverPropertySchema, ReachablePropertySchema, type Property } from '@shared/proof';

export type ParsedProperty = { ok: true; property: Property } | { ok: false; errors: string[] };

const KINDS = [
  ['never', NeverPropertySchema],
  ['always', AlwaysPropertySchema],
  ['after', AfterPropertySchema],
  ['reachable', ReachablePropertySchema],
] as const;

/** "line 2, column 5" for an offset into `text`. */
function where(text: string, offset: number): string {
  const before = text.slice(0, offset);
  const line = before.split('\n').length;
  const column = offset - before.lastIndexOf('\n');
  return `line ${line}, column ${column}`;
}

function syntaxError(text: string, error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  const at = /position (\d+)/.exec(message);
  const reason = message.replace(/\s*(in JSON )?at position \d+.*$/s, '').replace(/^JSON\.parse: /, '');
  return at ? `${where(text, Number(at[1]))}: ${reason}` : `not JSON: ${reason}`;
}

export function parsePropertyText(text: string): ParsedProperty {
  if (text.trim() === '') return { ok: false, errors: ['empty: type a property such as { "never": { "%QX1": true, "%QX2": true } }'] };
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    return { ok: false, errors: [syntaxError(text, error)] };
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return { ok: false, errors: ['a property is an object such as { "reachable": { "P3": "lit" } }'] };
  const kinds = KINDS.filter(([key]) => Object.hasOwn(value, key));
  if (kinds.length === 0) return { ok: false, errors: ['a property has one of "never", "always", "after" or "reachable"'] };
  if (kinds.length > 1) return { ok: false, errors: [`one kind per property, got ${kinds.map(([k]) => `"${k}"`).join(' and ')}`] };
  const parsed = kinds[0]![1].safeParse(value);
  if (parsed.success) return { ok: true, property: parsed.data };
  return { ok: false, errors: parsed.error.issues.map((i) => `${i.path.length > 0 ? i.path.join('.') : kinds[0]![0]}: ${i.message}`) };
}

/** A property as the field shows it for editing. */
export function propertyText(p: Property): string {
  return JSON.stringify(p, null, 2);
}
