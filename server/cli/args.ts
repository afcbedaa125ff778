/**
 * Command-line arguments → a command, with `node:util` parseArgs. A usage mistake comes back as
 * a message (exit 2), never as an exception.
 */
import { parseArgs } from 'node:util';

export type Command =
  | { name: 'check'; program: string; script: string; panel?: string; trace?: string; redact: boolean }
  | { name: 'validate'; program: string; panel?: string; json: boolean }
  | { name: 'st'; program: string }
  | { name: 'prove'; program: string; properties: string; panel?: string; maxStates?: number }
  | { name: 'help' };

export type ParsedArgs = { ok: true; command: Command } | { ok: false; error: string };

export const USAGE = `Rungwright command line

Usage:
  npm run cli -- check --program P --script S [--panel L] [--trace out.csv] [--redact]
  npm run cli -- validate --program P [--panel L] [--json]
  npm run cli -- st --program P
  npm run cli -- prove --program P --properties F [--panel L] [--max-states N]
  npm run cli -- create-admin --email E [--name N] [--link]   (password piped on standard input)
  npm run cli -- export-db --to postgres://…
  npm run cli -- --help

check     Grade a program with a check script; prints the grade report as JSON.
validate  Print the program's diagnostics.
st        Print the program as IEC 61131-3 Structured Text.
prove     Explore every behaviour of the program on the panel from power-up and decide
          each property of F ({ "properties": [ … ] }, see docs/proof.md); prints the
          proof report as JSON, with a replayed check script for each counterexample.

create-admin
          Create an administrator in DATA_DIR's database (stop the server first); see
          npm run cli -- create-admin --help. Exit 0 done, 1 a server holds DATA_DIR, 2 bad input.

export-db Copy DATA_DIR's database into an empty PostgreSQL database and check it row for row
          (stop the server first); see npm run cli -- export-db --help.

Exit codes (check, validate, st):
  0  all good: every check passes, no errors
  1  the program is at fault: a check fails, or it does not compile (then every
     check fails, "passed" is false, and the diagnostics are printed on stderr too)
  2  the inputs cannot be used: a file that cannot be read, bad JSON or XML, a bad
     check script or one with no check, a bad panel layout; the message names the file

--program P   the program: a Rungwright JSON document or a PLCopen TC6 XML 2.01 file (LD body)
--script S    a check script (JSON)
--panel L     a panel layout (JSON); the built-in panel named by the script if omitted
--trace F     also write the trace of inputs and outputs to F as CSV
--redact      print the student view of the report (hidden checks as pass/fail only)
--json        validate: print the diagnostics as JSON
--properties F  prove: the properties (JSON)
--max-states N  prove: give up (verdict "unknown") after N states per search; 200000 if omitted

Exit codes (prove):
  0  every property holds: proved, or reached for "reachable"
  1  a property is refuted or unreachable (or the program does not compile)
  2  the inputs cannot be used, as above
  3  a property is unknown (state limit reached) and none failed
`;

const OPTIONS = {
  program: { type: 'string' },
  script: { type: 'string' },
  panel: { type: 'string' },
  trace: { type: 'string' },
  redact: { type: 'boolean', default: false },
  json: { type: 'boolean', default: false },
  properties: { type: 'string' },
  'max-states': { type: 'string' },
  help: { type: 'boolean', short: 'h', default: false },
} as const;

/** Which options each command accepts (besides --help). */
const ACCEPTS = {
  check: ['program', 'script', 'panel', 'trace', 'redact'],
  validate: ['program', 'panel', 'json'],
  st: ['program'],
  prove: ['program', 'properties', 'panel', 'max-states'],
} as const;

type CommandName = keyof typeof ACCEPTS;

const isCommandName = (name: string): name is CommandName => Object.hasOwn(ACCEPTS, name);

/** Parse argv (without `node` and the script path). */
export function parseCliArgs(argv: readonly string[]): ParsedArgs {
  let parsed;
  try {
    parsed = parseArgs({ args: [...argv], options: OPTIONS, allowPositionals: true, strict: true });
  } catch (error) {
    // parseArgs reports unknown options and missing values by throwing; turn that into a message.
    const message = error instanceof Error ? error.message : String(error);
    return { ok: false, error: `${message.split('\n')[0]}\nRun with --help for usage.` };
  }
  const { values, positionals } = parsed;
  if (values.help || positionals.length === 0) return { ok: true, command: { name: 'help' } };
  const [name, ...extra] = positionals;
  if (!isCommandName(name!)) return { ok: false, error: `unknown command "${name}"; use check, validate, st, prove or create-admin (--help for usage)` };
  if (extra.length > 0) return { ok: false, error: `unexpected argument "${extra[0]}" after "${name}"` };
  const given = Object.keys(values).filter((k) => k !== 'help' && values[k as keyof typeof values] !== undefined && values[k as keyof typeof values] !== false);
  const accepted: readonly string[] = ACCEPTS[name];
  const stray = given.find((k) => !accepted.includes(k));
  if (stray) return { ok: false, error: `"${name}" does not take --${stray}` };
  if (!values.program) return { ok: false, error: `"${name}" needs --program P` };
  if (name === 'check') {
    if (!values.script) return { ok: false, error: '"check" needs --script S' };
    return {
      ok: true,
      command: { name, program: values.program, script: values.script, panel: values.panel, trace: values.trace, redact: values.redact === true },
    };
  }
  if (name === 'prove') {
    if (!values.properties) return { ok: false, error: '"prove" needs --properties F' };
    const text = values['max-states'];
    const maxStates = text === undefined ? undefined : Number(text);
    if (maxStates !== undefined && !(Number.isInteger(maxStates) && maxStates >= 1 && maxStates <= 10_000_000)) {
      return { ok: false, error: `--max-states needs a whole number from 1 to 10000000, got "${text}"` };
    }
    return { ok: true, command: { name, program: values.program, properties: values.properties, panel: values.panel, maxStates } };
  }
  if (name === 'validate') return { ok: true, command: { name, program: values.program, panel: values.panel, json: values.json === true } };
  return { ok: true, command: { name, program: values.program } };
}
