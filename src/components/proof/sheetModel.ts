/**
 * Pure edits of a program's proof sheet (`shared/api/proof.ts`): add, replace, label and delete a
 * property, keep and delete a saved check. Each returns the next sheet, or what stops it in words
 * (a limit of the contract), and never changes the sheet it is given.
 */
import { MAX_SAVED_CHECKS, MAX_SHEET_PROPERTIES, SavedCheckSchema, type ProofSheet, type SavedCheck } from '@shared/api/proof';
import type { CheckScript } from '@shared/checks';
import type { Property } from '@shared/proof';

export type SheetEdit = { ok: true; sheet: ProofSheet } | { ok: false; error: string };

export const EMPTY_SHEET: ProofSheet = { properties: [], checks: [] };

const sameJson = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);

export function addProperty(sheet: ProofSheet, property: Property): SheetEdit {
  if (sheet.properties.length >= MAX_SHEET_PROPERTIES) return { ok: false, error: `A sheet holds at most ${MAX_SHEET_PROPERTIES} properties; delete one first.` };
  if (sheet.properties.some((p) => sameJson(p, property))) return { ok: false, error: 'This property is already on the sheet.' };
  return { ok: true, sheet: { ...sheet, properties: [...sheet.properties, property] } };
}

export function replaceProperty(sheet: ProofSheet, index: number, property: Property): SheetEdit {
  if (index < 0 || index >= sheet.properties.length) return { ok: false, error: 'That property is no longer on the sheet.' };
  const properties = sheet.properties.map((p, i) => (i === index ? property : p));
  return { ok: true, sheet: { ...sheet, properties } };
}

/** A label of its own for a property; an empty one gives it back its plain words. */
export function labelProperty(sheet: ProofSheet, index: number, label: string): SheetEdit {
  const p = sheet.properties[index];
  if (!p) return { ok: false, error: 'That property is no longer on the sheet.' };
  const trimmed = label.trim();
  if (trimmed.length > 200) return { ok: false, error: 'A label has at most 200 characters.' };
  const { label: _old, ...rest } = p;
  return replaceProperty(sheet, index, (trimmed === '' ? rest : { ...rest, label: trimmed }) as Property);
}

export function removeProperty(sheet: ProofSheet, index: number): SheetEdit {
  if (index < 0 || index >= sheet.properties.length) return { ok: false, error: 'That property is no longer on the sheet.' };
  return { ok: true, sheet: { ...sheet, properties: sheet.properties.filter((_, i) => i !== index) } };
}

const MAX_WORDS = 200;
const clip = (text: string): string => (text.length <= MAX_WORDS ? text : `${text.slice(0, MAX_WORDS - 1)}…`);

/**
 * The script's title and step labels clipped to what a check script allows (200 characters): the
 * prover builds them from the property's label, which may itself be 200 long. Only words change.
 */
function clipWords(script: CheckScript): CheckScript {
  const steps = script.steps.map((step) => ('label' in step && typeof step.label === 'string' && step.label.length > MAX_WORDS ? { ...step, label: clip(step.label) } : step));
  return { ...script, ...(script.title !== undefined && { title: clip(script.title) }), steps };
}

/** "Save as check": the counterexample kept under the property's label (the same script twice is kept once). */
export function saveCheck(sheet: ProofSheet, label: string, found: CheckScript): SheetEdit {
  const script = clipWords(found);
  const check: SavedCheck = { label: clip(label.trim()) || 'Counterexample', script };
  const valid = SavedCheckSchema.safeParse(check);
  if (!valid.success) return { ok: false, error: `This counterexample cannot be kept as a check (${valid.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}).` };
  if (sheet.checks.some((c) => sameJson(c.script, script))) return { ok: false, error: 'This counterexample is already saved as a check.' };
  if (sheet.checks.length >= MAX_SAVED_CHECKS) return { ok: false, error: `A sheet keeps at most ${MAX_SAVED_CHECKS} checks; delete one first.` };
  return { ok: true, sheet: { ...sheet, checks: [...sheet.checks, check] } };
}

export function removeCheck(sheet: ProofSheet, index: number): SheetEdit {
  if (index < 0 || index >= sheet.checks.length) return { ok: false, error: 'That check is no longer on the sheet.' };
  return { ok: true, sheet: { ...sheet, checks: sheet.checks.filter((_, i) => i !== index) } };
}
