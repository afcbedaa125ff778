/**
 * The standard labs' answers never reach the browser bundle. The bundle is public — the sign-in
 * page names its chunks and they download without signing in — so the client is built once for
 * production, as `npm start` builds it, and every file it emits is searched for every hidden-check
 * label and every reference rung of the standard labs. The search is first shown to find each of
 * them where they are (the labs' own modules, the labs as JSON), so it can fail.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { build } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { STANDARD_LABS } from '@shared/labs';
import { answerMarkers, answersIn } from './answerMarkers';

const root = process.cwd();
const markers = answerMarkers(STANDARD_LABS);
let outDir = '';

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    return entry.isDirectory() ? filesUnder(full) : [full];
  });
}

/** Markers are plain ASCII: latin1 reads any file, text or binary, byte for byte. */
const read = (file: string): string => readFileSync(file, 'latin1');

beforeAll(async () => {
  outDir = mkdtempSync(path.join(tmpdir(), 'rw-bundle-'));
  // Vitest sets NODE_ENV to `test`; the build must be the production one the server serves.
  const nodeEnv = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({ root, configFile: path.join(root, 'vite.config.ts'), mode: 'production', logLevel: 'silent', build: { outDir, emptyOutDir: true } });
  } finally {
    process.env.NODE_ENV = nodeEnv;
  }
}, 180_000);

afterAll(() => {
  if (outDir) rmSync(outDir, { recursive: true, force: true });
});

describe('the search for the standard labs\' answers', () => {
  it('looks for every hidden check and every reference rung of the seven labs', () => {
    expect(STANDARD_LABS).toHaveLength(7);
    const hidden = STANDARD_LABS.flatMap((lab) => lab.script.steps.filter((s) => 'expect' in s && s.hidden));
    const rungs = STANDARD_LABS.flatMap((lab) => lab.solution.rungs);
    expect(markers.filter((m) => m.kind === 'hidden check')).toHaveLength(hidden.length);
    expect(markers.filter((m) => m.kind === 'reference rung')).toHaveLength(rungs.length);
    for (const lab of STANDARD_LABS) {
      expect(markers.some((m) => m.lab === lab.id && m.kind === 'hidden check'), lab.id).toBe(true);
      expect(markers.some((m) => m.lab === lab.id && m.kind === 'reference rung'), lab.id).toBe(true);
    }
  });

  it('finds every one of them in the labs\' own modules, which a leaking bundle would carry', () => {
    const labsDir = path.join(root, 'shared', 'labs');
    const sources = filesUnder(labsDir).map(read).join('\n');
    expect(answersIn(sources, markers)).toEqual(markers);
  });

  it('finds every one of them in the labs written as JSON, as an API answer would carry them', () => {
    expect(answersIn(JSON.stringify(STANDARD_LABS), markers)).toEqual(markers);
  });
});

describe('the production client bundle', () => {
  it('was built: an index page and its scripts', () => {
    const files = filesUnder(outDir).map((f) => path.relative(outDir, f));
    expect(files).toContain('index.html');
    expect(files.filter((f) => f.endsWith('.js')).length).toBeGreaterThan(10);
  });

  it('holds no hidden-check label and no reference rung of any standard lab, in any file', () => {
    const leaks = filesUnder(outDir).flatMap((file) => answersIn(read(file), markers).map((m) => `${path.relative(outDir, file)}: ${m.lab} ${m.kind} "${m.text}"`));
    expect(leaks).toEqual([]);
  });
});
