/**
 * `npm run cli -- …`: batch grading and program checks for scripts and CI pipelines, and
 * `create-admin` for a real install's first administrator, `export-db` to move the embedded
 * database to a PostgreSQL server. See `server/cli/args.ts` and
 * `server/cli/createAdmin.ts` for the usage texts.
 */
import { cliMain } from './cli/main';
import { processIO } from './cli/io';

const argv = process.argv.slice(2);
if (argv[0] === 'create-admin') {
  // Loaded only here: the file commands never start the database.
  const { createAdmin, readPipedStdin } = await import('./cli/createAdmin');
  const { systemClock } = await import('./clock');
  const io = processIO();
  process.exitCode = await createAdmin(argv.slice(1), { env: process.env, readStdin: readPipedStdin, stdout: io.stdout, stderr: io.stderr, clock: systemClock });
} else if (argv[0] === 'export-db') {
  const { exportDb } = await import('./cli/exportDb');
  const { systemClock } = await import('./clock');
  const io = processIO();
  process.exitCode = await exportDb(argv.slice(1), { env: process.env, stdout: io.stdout, stderr: io.stderr, clock: systemClock });
} else {
  process.exitCode = cliMain(argv, processIO());
}
