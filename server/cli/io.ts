/**
 * What the commands need from the outside world, passed in so tests can run them without files
 * or a process: read and write a file, print to stdout and stderr.
 */
import { readFileSync, writeFileSync } from 'node:fs';

export type FileResult<T> = { ok: true; value: T } | { ok: false; error: string };

export interface CliIO {
  readFile(path: string): FileResult<string>;
  writeFile(path: string, text: string): FileResult<void>;
  stdout(text: string): void;
  stderr(text: string): void;
}

/** Largest input file read, in bytes (a program, a script or a layout is far smaller). */
export const MAX_INPUT_BYTES = 5 * 1024 * 1024;

/** A short reason for a file-system error: "no such file", "permission denied". */
function fsReason(error: unknown): string {
  const code = (error as { code?: string }).code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  if (code === 'EISDIR') return 'is a directory, not a file';
  return error instanceof Error ? error.message : String(error);
}

/** The real file system and process streams. */
export function processIO(): CliIO {
  return {
    readFile(path) {
      try {
        const buffer = readFileSync(path);
        if (buffer.length > MAX_INPUT_BYTES) return { ok: false, error: `${path}: larger than ${MAX_INPUT_BYTES} bytes` };
        return { ok: true, value: buffer.toString('utf8') };
      } catch (error) {
        return { ok: false, error: `${path}: ${fsReason(error)}` };
      }
    },
    writeFile(path, text) {
      try {
        writeFileSync(path, text, 'utf8');
        return { ok: true, value: undefined };
      } catch (error) {
        return { ok: false, error: `${path}: cannot write: ${fsReason(error)}` };
      }
    },
    stdout: (text) => void process.stdout.write(text),
    stderr: (text) => void process.stderr.write(text),
  };
}
