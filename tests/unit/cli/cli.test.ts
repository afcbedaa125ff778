import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCliArgs } from '../../../server/cli/args';
import type { CliIO } from '../../../server/cli/io';
import { cliMain } from '../../../server/cli/main';

const root = path.resolve(__dirname, '../../..');
const fixture = (name: string) => readFileSync(path.join(root, 'tests/fixtures/checks', name), 'utf8');

/** An in-memory file system and captured streams. */
function memoryIO(files: Record<string, string>) {
  const out: string[] = [];
  const err: string[] = [];
  const written: Record<string, string> = {};
  const io: CliIO = {
    readFile: (p) => (Object.hasOwn(files, p) ? { ok: true, value: files[p]! } : { ok: false, error: `${p}: no such file` }),
    writeFile: (p, text) => {
      written[p] = text;
      return { ok: true, value: undefined };
    },
    stdout: (t) => void out.push(t),
    stderr: (t) => void err.push(t),
  };
  return { io, out: () => out.join(''), err: () => err.join(''), written };
}

const files = {
  'solution.json': fixture('three-wire.solution.json'),
  'starter.json': fixture('three-wire.starter.json'),
  'checks.json': fixture('three-wire.script.json'),
  'fr.xml': fixture('forward-reverse.solution.xml'),
  'fr-checks.json': fixture('forward-reverse.script.json'),
  'panel.json': fixture('reversing-conveyor.panel.json'),
  'broken.json': '{ "format": "rungwright.program", ',
  'notaprogram.json': '{ "hello": 1 }',
  'bad-script.json': JSON.stringify({ steps: [{ press: 'S2' }, { wait: 10 }, { wait: 10 }, { trip: 'K1' }, { expect: { K1: 'open' } }] }),
  'no-check.json': JSON.stringify({ steps: [{ press: 'S2' }, { wait: 10 }] }),
  'coil-on-input.json': JSON.stringify({ format: 'rungwright.program', version: 1, rungs: [{ id: 'r1', network: { kind: 'series', id: 's', items: [{ kind: 'contact', id: 'c', variant: 'no', operand: '%IX1' }, { kind: 'coil', id: 'q', variant: 'coil', operand: '%IX2' }] } }] }),
  'other-panel.json': JSON.stringify({ panel: 'mixer', steps: [{ wait: 10 }, { expect: { K1: 'open' } }] }),
  'bad-panel.json': JSON.stringify({ format: 'rungwright.panel', version: 1, id: 'x', title: 'x', devices: [{ id: 'S1', kind: 'pushbutton', label: 'a', feeds: '%IX9' }] }),
  'invalid-program.json': JSON.stringify({ format: 'rungwright.program', version: 1, rungs: [{ id: 'r1', network: { kind: 'series', id: 's', items: [{ kind: 'contact', id: 'c', variant: 'no', operand: '%IX42' }, { kind: 'coil', id: 'q', variant: 'coil', operand: '%QX1' }] } }] }),
  'bad.xml': '<project xmlns="http://www.plcopen.org/xml/tc6_0201"><unclosed></project>',
};

describe('parseCliArgs', () => {
  it('reads the check command with every option', () => {
    expect(parseCliArgs(['check', '--program', 'p.json', '--script', 's.json', '--panel', 'l.json', '--trace', 'out.csv'])).toEqual({
      ok: true,
      command: { name: 'check', program: 'p.json', script: 's.json', panel: 'l.json', trace: 'out.csv', redact: false },
    });
  });
  it('gives help without arguments or with --help', () => {
    expect(parseCliArgs([])).toEqual({ ok: true, command: { name: 'help' } });
    expect(parseCliArgs(['check', '--help'])).toEqual({ ok: true, command: { name: 'help' } });
  });
  it('says what is missing or wrong', () => {
    expect(parseCliArgs(['check', '--program', 'p.json'])).toEqual({ ok: false, error: '"check" needs --script S' });
    expect(parseCliArgs(['st'])).toEqual({ ok: false, error: '"st" needs --program P' });
    expect(parseCliArgs(['grade'])).toEqual({ ok: false, error: 'unknown command "grade"; use check, validate, st, prove or create-admin (--help for usage)' });
    expect(parseCliArgs(['st', '--program', 'p', '--script', 's'])).toEqual({ ok: false, error: '"st" does not take --script' });
    const unknown = parseCliArgs(['check', '--colour']);
    expect(unknown.ok).toBe(false);
    if (!unknown.ok) expect(unknown.error).toMatch(/--colour/);
  });
});

describe('cli check', () => {
  it('exits 0 and prints the grade report when every check passes', () => {
    const m = memoryIO(files);
    expect(cliMain(['check', '--program', 'solution.json', '--script', 'checks.json'], m.io)).toBe(0);
    const report = JSON.parse(m.out());
    expect(report).toMatchObject({ format: 'rungwright.grade-report', passed: true, score: 11, maxScore: 11 });
    expect(m.err()).toBe('');
  });
  it('exits 1 when a check fails', () => {
    const m = memoryIO(files);
    expect(cliMain(['check', '--program', 'starter.json', '--script', 'checks.json'], m.io)).toBe(1);
    expect(JSON.parse(m.out()).passed).toBe(false);
  });
  it('grades a PLCopen XML program and uses a panel layout file', () => {
    const m = memoryIO(files);
    expect(cliMain(['check', '--program', 'fr.xml', '--script', 'fr-checks.json', '--panel', 'panel.json', '--trace', 'out.csv'], m.io)).toBe(0);
    expect(JSON.parse(m.out()).score).toBe(14);
    expect(m.written['out.csv']!.split('\n')[0]).toBe('time_ms,scan,%IX1,%IX2,%IX3,%IX4,%IX5,%IX6,%IX7,%IX8,%QX1,%QX2,%QX3,%QX4,%QX5,%QX6');
  });
  it('prints the student view with --redact', () => {
    const m = memoryIO(files);
    cliMain(['check', '--program', 'solution.json', '--script', 'checks.json', '--redact'], m.io);
    const report = JSON.parse(m.out());
    expect(report.redacted).toBe(true);
    expect(report.checks.filter((c: { hidden: boolean; label?: string }) => c.hidden && c.label !== undefined)).toEqual([]);
  });
  it('grades a program with compile errors as failing (exit 1), with its diagnostics', () => {
    const m = memoryIO(files);
    expect(cliMain(['check', '--program', 'invalid-program.json', '--script', 'checks.json'], m.io)).toBe(1);
    expect(JSON.parse(m.out()).diagnostics.length).toBeGreaterThan(0);
  });
  it.each([
    [['check', '--program', 'missing.json', '--script', 'checks.json'], 'missing.json: no such file'],
    [['check', '--program', 'broken.json', '--script', 'checks.json'], 'broken.json: not valid JSON: '],
    [['check', '--program', 'notaprogram.json', '--script', 'checks.json'], 'notaprogram.json: not a Rungwright program: '],
    [['check', '--program', 'bad.xml', '--script', 'checks.json'], 'bad.xml: not a usable PLCopen XML program: '],
    [['check', '--program', 'solution.json', '--script', 'bad-script.json'], 'bad-script.json: does not fit the panel:\n  step 4: "trip" needs the id of an overload relay, got "K1" (a contactor)'],
    [['check', '--program', 'solution.json', '--script', 'other-panel.json'], 'other-panel.json: panel "mixer" is not built in; give its layout with --panel L'],
    [['check', '--program', 'solution.json', '--script', 'checks.json', '--panel', 'bad-panel.json'], 'bad-panel.json: not a valid panel layout:\n  devices[0].feeds: %IX9 is out of range: this panel has inputs %IX1..%IX8'],
    [['check', '--program', 'solution.json'], '"check" needs --script S'],
  ])('exits 2 on bad input %j with a message naming the file', (argv, message) => {
    const m = memoryIO(files);
    expect(cliMain(argv, m.io)).toBe(2);
    expect(m.err().startsWith(message)).toBe(true);
    expect(m.err()).not.toMatch(/\n\s+at /);
    expect(m.out()).toBe('');
  });
});

describe('exit codes: one meaning for check, validate and st', () => {
  // 0 all good; 1 the program is at fault; 2 the inputs cannot be used.
  it('a coil on an input: 1 from check, validate and st alike, with the diagnostic on stderr', () => {
    for (const argv of [
      ['check', '--program', 'coil-on-input.json', '--script', 'checks.json'],
      ['validate', '--program', 'coil-on-input.json'],
      ['validate', '--program', 'coil-on-input.json', '--json'],
      ['st', '--program', 'coil-on-input.json'],
    ]) {
      const m = memoryIO(files);
      expect(cliMain(argv, m.io), argv.join(' ')).toBe(1);
      const text = argv[0] === 'validate' && !argv.includes('--json') ? m.out() : m.err();
      expect(text, argv.join(' ')).toMatch(/coil-on-input\.json: error \(rung r1, element q\): .*%IX2/);
    }
  });
  it('check: a program that does not compile fails, "passed" false, every check failed, diagnostics on stderr', () => {
    const m = memoryIO(files);
    expect(cliMain(['check', '--program', 'invalid-program.json', '--script', 'checks.json'], m.io)).toBe(1);
    const report = JSON.parse(m.out());
    expect(report.passed).toBe(false);
    expect(report.checks.length).toBeGreaterThan(0);
    expect(report.checks.every((c: { passed: boolean }) => !c.passed)).toBe(true);
    expect(m.err()).toMatch(/^invalid-program\.json: does not compile, so every check fails:\n {2}invalid-program\.json: error/);
  });
  it('a script with no check is bad input (2), whatever the program, even one that does not compile', () => {
    for (const program of ['solution.json', 'invalid-program.json']) {
      const m = memoryIO(files);
      expect(cliMain(['check', '--program', program, '--script', 'no-check.json'], m.io)).toBe(2);
      expect(m.err()).toContain('no-check.json: not a valid check script:\n  "steps" has no check');
      expect(m.out()).toBe('');
    }
  });
  it('st and validate exit 2 on an unreadable or malformed file', () => {
    for (const argv of [['st', '--program', 'bad.xml'], ['validate', '--program', 'broken.json'], ['st', '--program', 'missing.json']]) {
      const m = memoryIO(files);
      expect(cliMain(argv, m.io), argv.join(' ')).toBe(2);
      expect(m.err()).toMatch(/^(bad\.xml|broken\.json|missing\.json): /);
    }
  });
  it('--help states the three codes', () => {
    const m = memoryIO(files);
    cliMain(['--help'], m.io);
    expect(m.out()).toMatch(/0 {2}all good[^]*1 {2}the program is at fault[^]*2 {2}the inputs cannot be used/);
  });
});

describe('cli validate and st', () => {
  it('validate exits 0 on a clean program and 1 (the program is at fault) when it has errors, naming them', () => {
    const ok = memoryIO(files);
    expect(cliMain(['validate', '--program', 'solution.json'], ok.io)).toBe(0);
    expect(ok.out()).toBe('solution.json: no problems found\n');
    const bad = memoryIO(files);
    expect(cliMain(['validate', '--program', 'invalid-program.json', '--json'], bad.io)).toBe(1);
    const parsed = JSON.parse(bad.out());
    expect(parsed.ok).toBe(false);
    expect(parsed.diagnostics.some((d: { message: string }) => d.message.includes('%IX42'))).toBe(true);
  });
  it('st prints Structured Text of a JSON or XML program', () => {
    const m = memoryIO(files);
    expect(cliMain(['st', '--program', 'fr.xml'], m.io)).toBe(0);
    expect(m.out()).toMatch(/^\(\*[^]*PROGRAM [^]*END_PROGRAM\n$/);
  });
  it('help prints the usage', () => {
    const m = memoryIO(files);
    expect(cliMain(['--help'], m.io)).toBe(0);
    expect(m.out()).toContain('npm run cli -- check --program P --script S [--panel L] [--trace out.csv]');
  });
});

describe('the real command', () => {
  const run = (...args: string[]) =>
    spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'server/cli.ts'), ...args], {
      cwd: root,
      encoding: 'utf8',
      timeout: 60_000,
    });
  const fx = (name: string) => path.join('tests/fixtures/checks', name);

  it('exits 0 with a PLCopen XML program and prints JSON', () => {
    const r = run('check', '--program', fx('forward-reverse.solution.xml'), '--script', fx('forward-reverse.script.json'));
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).passed).toBe(true);
  }, 60_000);
  it('exits 1 when a check fails and 2 on a missing file, without a stack trace', () => {
    const failing = run('check', '--program', fx('three-wire.starter.json'), '--script', fx('three-wire.script.json'));
    expect(failing.status).toBe(1);
    const missing = run('check', '--program', 'no/such.json', '--script', fx('three-wire.script.json'));
    expect(missing.status).toBe(2);
    expect(missing.stderr).toBe('no/such.json: no such file\n');
  }, 60_000);
});
