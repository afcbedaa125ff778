/**
 * `npm run bench`: runs every `tests/perf/*.bench.ts` module (or the ones named on the command
 * line) and prints one JSON line per case on stdout. Benchmarks are measured here, never in timed
 * tests. A case module exports `default async function (): Promise<BenchCase[]>`.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import path from 'node:path';

export interface BenchCase {
  case: string;
  [figure: string]: string | number | boolean | null;
}

const here = path.dirname(fileURLToPath(import.meta.url));
const wanted = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.includes(w)))
  .sort();

let failed = false;
for (const file of files) {
  try {
    const mod = (await import(pathToFileURL(path.join(here, file)).href)) as {
      default: () => Promise<BenchCase[]>;
    };
    for (const result of await mod.default()) console.log(JSON.stringify(result));
  } catch (err) {
    failed = true;
    console.error(`bench ${file} failed: ${err instanceof Error ? err.message : String(err)}`);
  }
}
process.exit(failed ? 1 : 0);
