/** The whole command line as one function of argv and the outside world, for tests and for `server/cli.ts`. */
import { parseCliArgs } from './args';
import { EXIT_BAD_INPUT, runCommand } from './commands';
import type { CliIO } from './io';

/** Run the command line; returns the exit code. Never throws and never prints a stack trace. */
export function cliMain(argv: readonly string[], io: CliIO): number {
  const parsed = parseCliArgs(argv);
  if (!parsed.ok) {
    io.stderr(`${parsed.error}\n`);
    return EXIT_BAD_INPUT;
  }
  try {
    return runCommand(io, parsed.command);
  } catch (error) {
    // A defect of ours, not the user's input; still a message, not a stack trace.
    io.stderr(`rungwright: internal error: ${error instanceof Error ? error.message : String(error)}\n`);
    return EXIT_BAD_INPUT;
  }
}
