/**
 * Program files in and out: a PLCopen XML upload becomes a new program (version 1); a version is
 * exported as PLCopen TC6 XML or as the native JSON document.
 */
import type { Program as ProgramDocument } from '@shared/ladder/schema';
import type { ProgramDetail } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { success, type Outcome } from '../http/failure';
import { listProgramsByOwner } from '../db/programs';
import { createProgram } from './programs';
import { exportPlcopenXml, importPlcopenXml } from './ladderDocuments';

export async function importProgramFile(ctx: AppContext, actor: User, xml: string, fileName: string): Promise<Outcome<ProgramDetail & { warnings: string[] }>> {
  const imported = importPlcopenXml(xml);
  if (!imported.ok) return imported;
  const { program, warnings } = imported.value;
  const wanted = program.title.trim() || fileName.replace(/\.xml$/i, '') || 'Imported program';
  const taken = new Set((await listProgramsByOwner(ctx.orm, actor.id)).map((p) => p.title));
  const title = unusedTitle(wanted, taken);
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

export interface ExportedFile {
  fileName: string;
  contentType: string;
  content: string;
}

/** A file name safe in a Content-Disposition header: letters, digits and dashes. */
function slug(title: string): string {
  return title.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'program';
}

export function exportProgramFile(title: string, version: number, document: ProgramDocument, format: 'json' | 'plcopen', now: Date): ExportedFile {
  const base = `${slug(title)}-v${version}`;
  if (format === 'json') {
    return { fileName: `${base}.json`, contentType: 'application/json; charset=utf-8', content: `${JSON.stringify(document, null, 2)}\n` };
  }
  return { fileName: `${base}.xml`, contentType: 'application/xml; charset=utf-8', content: exportPlcopenXml(document, now) };
}
