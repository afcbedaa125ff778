/**
 * The commands themselves. Each returns the exit code, with one meaning for every command:
 * 0 all good; 1 the program is at fault (a check fails, or it does not compile, with its
 * diagnostics on stderr); 2 the inputs cannot be used (unreadable file, bad JSON or XML, a bad
 * script or one without a check, a bad panel), with a message on stderr naming the file.
 */
import { parseCheckScript, redactReport, runChecks, traceToCSV } from '@shared/checks';
import { builtInPanel, type PanelLayout } from '@shared/field';
import { DEFAULT_ADDRESS_SPACE, programToStructuredText, validateProgram, type Diagnostic } from '@shared/ladder';
import { PropertiesFileSchema, proofExitCode, proofReport, prove } from '@shared/proof';
import { formatIssues } from '@shared/field';
import { DEFAULT_SCAN_MS } from '@shared/engine';
import type { Command } from './args';
import { USAGE } from './args';
import type { CliIO, FileResult } from './io';
import { loadJson, loadPanel, loadProgram } from './load';

export const EXIT_OK = 0;
/** The program is at fault: a check fails, or it does not compile. */
export const EXIT_PROGRAM_FAULT = 1;
export const EXIT_BAD_INPUT = 2;

function badInput(io: CliIO, message: string): number {
  io.stderr(`${message}\n`);
  return EXIT_BAD_INPUT;
}

function panelFor(io: CliIO, panelPath: string | undefined, wanted: string, scriptPath: string): FileResult<PanelLayout> {
  if (panelPath !== undefined) return loadPanel(io, panelPath);
  const panel = builtInPanel(wanted);
  if (panel) return { ok: true, value: panel };
  return { ok: false, error: `${scriptPath}: panel "${wanted}" is not built in; give its layout with --panel L` };
}

function check(io: CliIO, command: Extract<Command, { name: 'check' }>): number {
  const loaded = loadProgram(io, command.program);
  if (!loaded.ok) return badInput(io, loaded.error);
  for (const warning of loaded.value.warnings) io.stderr(`${warning}\n`);
  const json = loadJson(io, command.script);
  if (!json.ok) return badInput(io, json.error);
  const script = parseCheckScript(json.value);
  if (!script.ok) return badInput(io, `${command.script}: not a valid check script:\n  ${script.errors.join('\n  ')}`);
  const panel = panelFor(io, command.panel, script.value.panel, command.script);
  if (!panel.ok) return badInput(io, panel.error);
  const result = runChecks({ program: loaded.value.program, panel: panel.value, script: script.value });
  if (!result.ok) return badInput(io, `${command.script}: does not fit the panel:\n  ${result.errors.join('\n  ')}`);
  const report = result.report;
  const compileErrors = report.diagnostics.filter((d) => d.severity === 'error');
  if (compileErrors.length > 0) {
    io.stderr(`${command.program}: does not compile, so every check fails:\n${compileErrors.map((d) => `  ${describeDiagnostic(command.program, d)}`).join('\n')}\n`);
  }
  if (command.trace !== undefined) {
    const written = io.writeFile(command.trace, traceToCSV(report.trace));
    if (!written.ok) return badInput(io, written.error);
  }
  io.stdout(`${JSON.stringify(command.redact ? redactReport(report) : report, null, 2)}\n`);
  return report.passed ? EXIT_OK : EXIT_PROGRAM_FAULT;
}

/** "prog.json: rung r2, element e3: message" */
function describeDiagnostic(path: string, d: Diagnostic): string {
  const where = [d.rungId ? `rung ${d.rungId}` : 'program', d.elementId ? `element ${d.elementId}` : null].filter(Boolean).join(', ');
  return `${path}: ${d.severity} (${where}): ${d.message}`;
}

function validate(io: CliIO, command: Extract<Command, { name: 'validate' }>): number {
  const loaded = loadProgram(io, command.program);
  if (!loaded.ok) return badInput(io, loaded.error);
  for (const warning of loaded.value.warnings) io.stderr(`${warning}\n`);
  let space = DEFAULT_ADDRESS_SPACE;
  if (command.panel !== undefined) {
    const panel = loadPanel(io, command.panel);
    if (!panel.ok) return badInput(io, panel.error);
    space = { inputs: panel.value.inputs, outputs: panel.value.outputs, memory: DEFAULT_ADDRESS_SPACE.memory };
  }
  const diagnostics = validateProgram(loaded.value.program, space);
  const errors = diagnostics.filter((d) => d.severity === 'error');
  if (command.json) io.stdout(`${JSON.stringify({ ok: errors.length === 0, diagnostics }, null, 2)}\n`);
  else if (diagnostics.length === 0) io.stdout(`${command.program}: no problems found\n`);
  else io.stdout(`${diagnostics.map((d) => describeDiagnostic(command.program, d)).join('\n')}\n`);
  // The file was read: its errors are the program's fault (1), as in `check`, not unusable input (2).
  if (errors.length > 0 && command.json) io.stderr(`${errors.map((d) => describeDiagnostic(command.program, d)).join('\n')}\n`);
  return errors.length > 0 ? EXIT_PROGRAM_FAULT : EXIT_OK;
}

function structuredText(io: CliIO, command: Extract<Command, { name: 'st' }>): number {
  const loaded = loadProgram(io, command.program);
  if (!loaded.ok) return badInput(io, loaded.error);
  for (const warning of loaded.value.warnings) io.stderr(`${warning}\n`);
  const text = programToStructuredText(loaded.value.program);
  io.stdout(text.endsWith('\n') ? text : `${text}\n`);
  // The text is printed either way (it helps to read a broken program), but the exit code says
  // what it says for `check` and `validate`: a program with errors is at fault.
  const errors = validateProgram(loaded.value.program, DEFAULT_ADDRESS_SPACE).filter((d) => d.severity === 'error');
  if (errors.length === 0) return EXIT_OK;
  io.stderr(`${errors.map((d) => describeDiagnostic(command.program, d)).join('\n')}\n`);
  return EXIT_PROGRAM_FAULT;
}

/** Decide properties of a program; exit 0 all hold, 1 one fails, 2 bad input, 3 one unknown and none failed. */
function proveCommand(io: CliIO, command: Extract<Command, { name: 'prove' }>): number {
  const loaded = loadProgram(io, command.program);
  if (!loaded.ok) return badInput(io, loaded.error);
  for (const warning of loaded.value.warnings) io.stderr(`${warning}\n`);
  const json = loadJson(io, command.properties);
  if (!json.ok) return badInput(io, json.error);
  const file = PropertiesFileSchema.safeParse(json.value);
  if (!file.success) return badInput(io, `${command.properties}: not a valid properties file:\n  ${formatIssues(file.error).join('\n  ')}`);
  const panel = panelFor(io, command.panel, 'reversing-conveyor', command.properties);
  if (!panel.ok) return badInput(io, panel.error);
  const result = prove({ program: loaded.value.program, panel: panel.value, properties: file.data.properties, maxStates: command.maxStates, now: () => performance.now() });
  if (!result.ok) {
    const compileErrors = (result.diagnostics ?? []).filter((d) => d.severity === 'error');
    if (compileErrors.length > 0) {
      io.stderr(`${command.program}: does not compile, so nothing can be proved:\n${compileErrors.map((d) => `  ${describeDiagnostic(command.program, d)}`).join('\n')}\n`);
      return EXIT_PROGRAM_FAULT;
    }
    return badInput(io, `${command.properties}: cannot be decided on panel ${panel.value.id}:\n  ${result.errors.join('\n  ')}`);
  }
  for (const r of result.results) if (r.defect) io.stderr(`${command.properties}: "${r.label}": ${r.reason ?? 'defect'}\n`);
  io.stdout(`${JSON.stringify(proofReport(panel.value.id, DEFAULT_SCAN_MS, result.results, result.abstractions, result.ignoredDevices), null, 2)}\n`);
  return proofExitCode(result.results);
}

/** Run a parsed command. */
export function runCommand(io: CliIO, command: Command): number {
  switch (command.name) {
    case 'help':
      io.stdout(USAGE);
      return EXIT_OK;
    case 'check':
      return check(io, command);
    case 'validate':
      return validate(io, command);
    case 'st':
      return structuredText(io, command);
    case 'prove':
      return proveCommand(io, command);
  }
}
