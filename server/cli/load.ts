/**
 * Reading the command's input files: a program (native JSON or PLCopen XML, told apart by
 * content), a check script, a panel layout. Every error names the file and what is wrong.
 */
import { parsePanelLayout, type PanelLayout } from '@shared/field';
import { parseProgram, type Program } from '@shared/ladder';
import { importPlcopen } from '@shared/ladder/plcopen';
import type { CliIO, FileResult } from './io';

export interface LoadedProgram {
  program: Program;
  /** Import warnings (PLCopen), each prefixed with the file name. */
  warnings: string[];
}

const fail = <T>(error: string): FileResult<T> => ({ ok: false, error });

/** JSON.parse with a located message instead of an exception. */
export function parseJsonText(path: string, text: string): FileResult<unknown> {
  try {
    return { ok: true, value: JSON.parse(text) as unknown };
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    return fail(`${path}: not valid JSON: ${reason}`);
  }
}

/** A program file: XML if its first non-blank character is `<`, JSON otherwise. */
export function loadProgram(io: CliIO, path: string): FileResult<LoadedProgram> {
  const read = io.readFile(path);
  if (!read.ok) return read;
  const text = read.value.replace(/^\uFEFF/, '');
  if (text.trimStart().startsWith('<')) {
    const imported = importPlcopen(text);
    if (!imported.ok) return fail(`${path}: not a usable PLCopen XML program: ${imported.error}`);
    return { ok: true, value: { program: imported.value.program, warnings: imported.value.warnings.map((w) => `${path}: warning: ${w}`) } };
  }
  const json = parseJsonText(path, text);
  if (!json.ok) return json;
  const program = parseProgram(json.value);
  if (!program.ok) return fail(`${path}: not a Rungwright program: ${program.error}`);
  return { ok: true, value: { program: program.value, warnings: [] } };
}

/** A JSON file (the check script: the runner reads its shape step by step). */
export function loadJson(io: CliIO, path: string): FileResult<unknown> {
  const read = io.readFile(path);
  if (!read.ok) return read;
  return parseJsonText(path, read.value.replace(/^\uFEFF/, ''));
}

/** A panel layout file. */
export function loadPanel(io: CliIO, path: string): FileResult<PanelLayout> {
  const json = loadJson(io, path);
  if (!json.ok) return json;
  const panel = parsePanelLayout(json.value);
  if (!panel.ok) return fail(`${path}: not a valid panel layout:\n  ${panel.errors.join('\n  ')}`);
  return { ok: true, value: panel.value };
}
