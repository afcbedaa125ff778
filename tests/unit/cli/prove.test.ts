import { describe, expect, it } from 'vitest';
import { standardLab } from '@shared/labs';
import { parseCliArgs } from '../../../server/cli/args';
import type { CliIO } from '../../../server/cli/io';
import { cliMain } from '../../../server/cli/main';
import { MISTAKES } from '../labs/mistakes';

const props = (properties: unknown[]) => JSON.stringify({ properties });
const INTERLOCK = { never: { '%QX1': true, '%QX2': true }, label: 'K1 and K2 are never commanded together' };

const files: Record<string, string> = {
  'fr.json': JSON.stringify(standardLab('forward-reverse')!.solution),
  'fr-bad.json': JSON.stringify(MISTAKES.find((m) => m.name.startsWith('interlocked on the auxiliary contacts only'))!.program),
  'horn.json': JSON.stringify(standardLab('warning-horn')!.solution),
  'interlock.json': props([INTERLOCK, { reachable: { K2: 'closed' } }]),
  'motor.json': props([{ never: { M1: 'reverse' } }]),
  'unknown-device.json': props([{ never: { K9: 'closed' } }]),
  'unknown-tag.json': props([{ never: { Nothing_Here: true } }]),
  'empty.json': props([]),
  'shape.json': JSON.stringify({ properties: [{ never: { K1: 'closed' }, within: 5 }] }),
  'horn-window.json': props([{ after: { H1: 'sounding' }, within: 3000, expect: { H1: 'silent' } }]),
  'broken.json': '{ "properties": [',
};

function run(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = {
    readFile: (p) => (Object.hasOwn(files, p) ? { ok: true, value: files[p]! } : { ok: false, error: `${p}: no such file` }),
    writeFile: () => ({ ok: true, value: undefined }),
    stdout: (t) => void out.push(t),
    stderr: (t) => void err.push(t),
  };
  const code = cliMain(argv, io);
  return { code, out: out.join(''), err: err.join('') };
}

describe('prove on the command line', () => {
  it('reads its options', () => {
    expect(parseCliArgs(['prove', '--program', 'p.xml', '--properties', 'f.json', '--panel', 'l.json', '--max-states', '500'])).toEqual({
      ok: true,
      command: { name: 'prove', program: 'p.xml', properties: 'f.json', panel: 'l.json', maxStates: 500 },
    });
    expect(parseCliArgs(['prove', '--program', 'p.xml'])).toEqual({ ok: false, error: '"prove" needs --properties F' });
    expect(parseCliArgs(['prove', '--program', 'p', '--properties', 'f', '--max-states', 'many'])).toEqual({
      ok: false,
      error: '--max-states needs a whole number from 1 to 10000000, got "many"',
    });
  });

  it('exits 0 when every property holds, and prints the report', () => {
    const { code, out } = run('prove', '--program', 'fr.json', '--properties', 'interlock.json');
    expect(code).toBe(0);
    const report = JSON.parse(out);
    expect(report.format).toBe('rungwright.proof-report');
    expect(report.results.map((r: { label: string; verdict: string }) => [r.label, r.verdict])).toEqual([
      ['K1 and K2 are never commanded together', 'proved'],
      ['reachable K2 closed', 'reached'],
    ]);
    expect(report.results[0].counterexample).toBeUndefined();
    expect(report.results[1].counterexample.steps.at(-1)).toMatchObject({ expect: { K2: 'closed' } });
    expect(typeof report.results[0].ms).toBe('number');
  });

  it('exits 1 with the shortest counterexample when one is refuted, and the counterexample passes check', () => {
    const { code, out } = run('prove', '--program', 'fr-bad.json', '--properties', 'interlock.json');
    expect(code).toBe(1);
    const refuted = JSON.parse(out).results[0];
    expect(refuted.verdict).toBe('refuted');
    // Both buttons in the same scan: one scan is the shortest.
    expect(refuted.counterexample.steps).toEqual([
      { press: 'S2' },
      { press: 'S3' },
      { wait: 10 },
      { expect: { '%QX1': true, '%QX2': true }, label: 'violated: K1 and K2 are never commanded together' },
    ]);
    files['cx.json'] = JSON.stringify(refuted.counterexample);
    expect(run('check', '--program', 'fr-bad.json', '--script', 'cx.json').code).toBe(0);
  });

  it('exits 3 when the state limit cuts the search, saying how far it got', () => {
    const { code, out } = run('prove', '--program', 'horn.json', '--properties', 'horn-window.json', '--max-states', '50');
    expect(code).toBe(3);
    const result = JSON.parse(out).results[0];
    expect(result.verdict).toBe('unknown');
    expect(result.reason).toMatch(/^state limit of 50 reached after 50 states; every behaviour up to \d+ scans/);
  });

  it.each([
    ['motor.json', /"M1" is a motor: its speed is not modelled by the proof/],
    ['unknown-device.json', /property 1 \(never K9 closed\): "K9" is not a device on panel reversing-conveyor/],
    ['unknown-tag.json', /"Nothing_Here" names nothing in this program/],
    ['empty.json', /empty\.json: not a valid properties file/],
    ['shape.json', /shape\.json: not a valid properties file/],
    ['broken.json', /broken\.json: not valid JSON/],
    ['missing.json', /missing\.json: no such file/],
  ])('exits 2 for a bad properties file: %s', (file, message) => {
    const { code, err, out } = run('prove', '--program', 'fr.json', '--properties', file);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(message);
  });
});
