/**
 * Preloaded into a real server process (`node --import tsx --import <this> server/index.ts`) so that
 * two servers reach the DATA_DIR lock at the same instant. Spawned processes finish loading their
 * modules hundreds of milliseconds apart, so this first loads every module `server/index.ts`
 * imports (they are then cached, and the entry reaches the lock within a millisecond), says
 * `ready` on stdout, waits for the test to write the shared instant into `RACE_GO_FILE`, and
 * spins until that instant. Test-only: the server itself has no hook for this.
 */
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';

const goFile = process.env.RACE_GO_FILE;
if (goFile) {
  const entry = path.resolve('server/index.ts');
  const imports = [...readFileSync(entry, 'utf8').matchAll(/^import .* from '(\.[^']+)';$/gm)].map((m) => m[1]!);
  for (const specifier of imports) await import(pathToFileURL(path.resolve(path.dirname(entry), `${specifier}.ts`)).href);
  process.stdout.write('ready\n');
  const pause = new Int32Array(new SharedArrayBuffer(4));
  while (!existsSync(goFile)) Atomics.wait(pause, 0, 0, 1);
  const at = Number(readFileSync(goFile, 'utf8'));
  while (Date.now() < at) {
    // spin: a timer would wake each process a different few milliseconds late
  }
  process.stderr.write(`race: reached the instant ${Date.now() - at} ms late\n`);
}
