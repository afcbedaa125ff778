/**
 * Program files in and out: a PLCopen XML upload becomes a new program (version 1); a version is
 * exported as PLCopen TC6 XML or as the native JSON document. The document work itself (parse,
 * check, convert) runs in the worker pool (`grading/documentJobs.ts`), never on the main thread.
 */
import type { ProgramDetail } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { findProgram, listProgramsByOwner } from '../db/programs';
import { failure, success, type Outcome } from '../http/failure';
import type { ExportedFile, ExportFormat } from '../grading/documentJobs';
import { createProgram, getVersion } from './programs';

export type { ExportedFile };

export async function importProgramFile(ctx: AppContext, actor: User, xml: string, fileName: string): Promise<Outcome<ProgramDetail & { warnings: string[] }>> {
  const imported = await ctx.documents.importProgram({ xml, fileName });
  if (!imported.ok) return imported;
  const { program, warnings } = imported.value;
  const taken = new Set((await listProgramsByOwner(ctx.orm, actor.id)).map((p) => p.title));
  const title = unusedTitle(imported.value.title, taken);
  const created = await createProgram(ctx, actor, { title, document: program, message: `Imported from ${fileName}` });
  return created.ok ? success({ ...created.value, warnings }) : created;
}

/**
 * The title, or the first of "title (2)", "title (3)"… not among `taken`: an import of a file
 * exported from an existing program must not give a second program the very same name in the list.
 */
export function unusedTitle(title: string, taken: ReadonlySet<string>): string {
  if (!taken.has(title)) return title;
  for (let n = 2; ; n += 1) {
    const candidate = `${title.slice(0, 190)} (${n})`;
    if (!taken.has(candidate)) return candidate;
  }
}

/** Version `number` of a program the actor may read, as a file to download. */
export async function exportVersion(ctx: AppContext, actor: User, programId: string, number: number, format: ExportFormat): Promise<Outcome<ExportedFile>> {
  const version = await getVersion(ctx, actor, programId, number);
  if (!version.ok) return version;
  const program = await findProgram(ctx.orm, programId);
  if (!program) return failure('not_found', 'This program does not exist or is not open to you');
  let documentJson: string;
  try {
    // Serialising here costs a few ms for 5,000 rungs; a structured clone of the object, ~20 ms.
    documentJson = JSON.stringify(version.value.document);
  } catch {
    return failure('invalid_document', `Version ${number} cannot be exported: its document is nested too deeply to read`);
  }
  return ctx.documents.exportProgram({
    documentJson,
    title: program.title,
    version: number,
    format,
    now: ctx.clock.now().toISOString(),
  });
}
