/**
 * Exporting a version and importing a PLCopen file, as plain-data jobs for the worker pool: both
 * walk the whole document (a 5,000-rung PLCopen export took 1.1–1.5 s of CPU here), so they run
 * off the main thread, like grading. Pure functions that never throw: a problem comes back as the
 * failure to answer.
 */
import type { Program } from '@shared/ladder/schema';
import { failure, success, type Outcome } from '../http/failure';
import { checkProgramDocument, exportPlcopenXml, importPlcopenXml } from '../services/ladderDocuments';

export type ExportFormat = 'json' | 'plcopen';

export interface ExportJob {
  /** The stored document as JSON text: a string crosses to the worker far cheaper than a deep object. */
  documentJson: string;
  title: string;
  version: number;
  format: ExportFormat;
  /** ISO time for the PLCopen file header. */
  now: string;
}

export interface ExportedFile {
  fileName: string;
  contentType: string;
  /** UTF-8 bytes, moved (not copied) back from the worker. */
  body: Uint8Array;
}

export interface ImportJob {
  xml: string;
  fileName: string;
}

export interface ImportedProgram {
  program: Program;
  /** The program's own title, else the file name without `.xml`. */
  title: string;
  warnings: string[];
}

/** A file name safe in a Content-Disposition header: letters, digits and dashes. */
function slug(title: string): string {
  return title.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'program';
}

function problem(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

/** The version as PLCopen TC6 XML or as the native JSON document. */
export function exportJob(job: ExportJob): Outcome<ExportedFile> {
  try {
    const checked = checkProgramDocument(JSON.parse(job.documentJson), 'open');
    if (!checked.ok) return checked;
    const base = `${slug(job.title)}-v${job.version}`;
    const encode = (text: string): Uint8Array => new TextEncoder().encode(text);
    if (job.format === 'json') {
      return success({ fileName: `${base}.json`, contentType: 'application/json; charset=utf-8', body: encode(`${JSON.stringify(checked.value, null, 2)}\n`) });
    }
    return success({ fileName: `${base}.xml`, contentType: 'application/xml; charset=utf-8', body: encode(exportPlcopenXml(checked.value, new Date(job.now))) });
  } catch (err) {
    return failure('processing_limit', `The program could not be exported: ${problem(err)}`);
  }
}

/** A PLCopen XML upload read into a checked program document. */
export function importJob(job: ImportJob): Outcome<ImportedProgram> {
  try {
    const imported = importPlcopenXml(job.xml);
    if (!imported.ok) return imported;
    const { program, warnings } = imported.value;
    const title = (program.title.trim() || job.fileName.replace(/\.xml$/i, '').trim() || 'Imported program').slice(0, 200);
    return success({ program, title, warnings });
  } catch (err) {
    return failure('processing_limit', `The file could not be imported: ${problem(err)}`);
  }
}
