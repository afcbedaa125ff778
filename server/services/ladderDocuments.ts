/**
 * The one place the server touches the program document toolkit of `shared/ladder`: checking a
 * document before it is stored, diffing two versions, PLCopen XML in and out.
 */
import { ProgramSchema, type Program } from '@shared/ladder/schema';
import type { RungDiffView } from '@shared/api';
import { importPlcopen } from '@shared/ladder/plcopen/importProject';
import { exportPlcopen } from '@shared/ladder/plcopen/exportProject';
import { fieldsFromZod, failure, success, type Outcome } from '../http/failure';

/**
 * Parses a document with the shared schema. A document that fails is refused with the problems,
 * located by path; nothing is stored.
 */
export function checkProgramDocument(json: unknown): Outcome<Program> {
  const parsed = ProgramSchema.safeParse(json);
  if (!parsed.success) {
    const fields = fieldsFromZod(parsed.error, 'document');
    return failure('invalid_document', `The program document has ${parsed.error.issues.length} problem(s); nothing was saved`, {
      fields,
      details: { diagnostics: Object.entries(fields).map(([path, message]) => ({ path, message })) },
    });
  }
  return success(parsed.data);
}

/** Rung by rung, matched by rung id. */
export function diffProgramDocuments(before: Program, after: Program): RungDiffView[] {
  const text = (rung: Program['rungs'][number]) => JSON.stringify(rung.network);
  const old = new Map(before.rungs.map((r) => [r.id, r]));
  const result: RungDiffView[] = [];
  for (const rung of after.rungs) {
    const prev = old.get(rung.id);
    if (!prev) result.push({ kind: 'added', rungId: rung.id, after: text(rung) });
    else result.push({ kind: text(prev) === text(rung) && prev.comment === rung.comment ? 'same' : 'changed', rungId: rung.id, before: text(prev), after: text(rung) });
    old.delete(rung.id);
  }
  for (const [rungId, rung] of old) result.push({ kind: 'removed', rungId, before: text(rung) });
  return result;
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
