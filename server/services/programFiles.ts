/**
 * Program files in and out: a PLCopen XML upload becomes a new program (version 1); a version is
 * exported as PLCopen TC6 XML or as the native JSON document.
 */
import type { Program as ProgramDocument } from '@shared/ladder/schema';
import type { ProgramDetail } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { success, type Outcome } from '../http/failure';
import { createProgram } from './programs';
import { exportPlcopenXml, importPlcopenXml } from './ladderDocuments';

export async function importProgramFile(ctx: AppContext, actor: User, xml: string, fileName: string): Promise<Outcome<ProgramDetail & { warnings: string[] }>> {
  const imported = importPlcopenXml(xml);
  if (!imported.ok) return imported;
  const { program, warnings } = imported.value;
  const title = program.title.trim() || fileName.replace(/\.xml$/i, '') || 'Imported program';
  const created = await createProgram(ctx, actor, { title, document: program, message: `Imported from ${fileName}` });
  return created.ok ? success({ ...created.value, warnings }) : created;
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
