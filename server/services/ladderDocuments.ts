/**
 * The one place the server touches the program document toolkit of `shared/ladder`: checking a
 * document before it is stored, diffing two versions, PLCopen XML in and out.
 */
import { ProgramSchema, type Program } from '@shared/ladder/schema';
import { checkDocumentBounds, diffPrograms, parseProgram } from '@shared/ladder';
import { exportPlcopen, importPlcopen } from '@shared/ladder/plcopen';
import type { RungDiffView } from '@shared/api';
import { fieldsFromZod, failure, success, type Outcome } from '../http/failure';

/**
 * Parses and normalises a document with `parseProgram` (the shared schema plus unique ids). A
 * document that fails is refused with the problem located by path; nothing is stored (`purpose`
 * says which verb the message uses: a stored document can be too deep to open). Semantic
 * diagnostics (`validateProgram`) do not refuse a save: a half-drawn rung can be saved.
 */
export function checkProgramDocument(json: unknown, purpose: 'store' | 'open' = 'store'): Outcome<Program> {
  const parsed = parseProgram(json);
  if (parsed.ok) return success(parsed.value);
  // A document past the size limits never reaches the schema (it recurses per level).
  const outOfBounds = checkDocumentBounds(json);
  const schema = outOfBounds ? null : ProgramSchema.safeParse(json);
  const fields = outOfBounds
    ? { [['document', ...outOfBounds.path].join('.')]: outOfBounds.message }
    : !schema || schema.success
      ? { document: parsed.error }
      : fieldsFromZod(schema.error, 'document');
  return failure('invalid_document', `The program document cannot be ${purpose === 'store' ? 'stored' : 'opened'}: ${parsed.error}`, {
    fields,
    details: { diagnostics: Object.entries(fields).map(([path, message]) => ({ path, message })) },
  });
}

/** Rung by rung, matched by rung id, with each rung's one-line text form. */
export function diffProgramDocuments(before: Program, after: Program): RungDiffView[] {
  return diffPrograms(before, after).map((d) => ({
    kind: d.kind,
    rungId: d.rungId,
    ...(d.before !== undefined ? { before: d.before } : {}),
    ...(d.after !== undefined ? { after: d.after } : {}),
    ...(d.beforeComment !== undefined ? { beforeComment: d.beforeComment } : {}),
    ...(d.afterComment !== undefined ? { afterComment: d.afterComment } : {}),
    ...(d.changedParts !== undefined ? { changedParts: d.changedParts } : {}),
  }));
}

/** A DOCTYPE or an entity declaration is refused before any parser sees the text (XML bomb defence). */
const DTD_PATTERN = /<!\s*(DOCTYPE|ENTITY)/i;

/** Reads a PLCopen XML upload into a program document (checked with the shared schema too). */
export function importPlcopenXml(xml: string): Outcome<{ program: Program; warnings: string[] }> {
  if (DTD_PATTERN.test(xml)) {
    return failure('validation', 'The XML file declares a DOCTYPE or entities; these are refused (they can expand without bound)', {
      fields: { file: 'DOCTYPE and ENTITY declarations are not accepted' },
    });
  }
  const imported = importPlcopen(xml);
  if (!imported.ok) return failure('invalid_document', `The PLCopen file cannot be imported: ${imported.error}`, { fields: { file: imported.error } });
  const checked = checkProgramDocument(imported.value.program);
  return checked.ok ? success({ program: checked.value, warnings: imported.value.warnings }) : checked;
}

/** PLCopen TC6 XML of a document; `now` fills the file header's creation time. */
export function exportPlcopenXml(program: Program, now: Date): string {
  return exportPlcopen(program, { now: now.toISOString() });
}
