/**
 * shared/ stays pure, and the tools say so: ESLint refuses a file there that reaches Node, the
 * DOM, a timer, the clock or the global random source, and `tsconfig.shared.json` typechecks
 * shared/ without Node or DOM types. Its modules import each other without circles, type-only
 * imports included (a circle is two modules that cannot be read, or moved, one without the other).
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const PROBE = `import { readFileSync } from 'fs';
import { join } from 'node:path';
export const probe = [
  readFileSync,
  join,
  Buffer.from('x'),
  process.env,
  setTimeout(() => 0, 1),
  document.title,
  performance.now(),
  crypto.randomUUID(),
  Date.now(),
  new Date(),
  Math.random(),
  globalThis.fetch,
];
`;

describe('shared/', () => {
  it('refuses Node modules, the DOM, timers, the clock and the global random', async () => {
    const eslint = new ESLint({ cwd: process.cwd() });
    const [result] = await eslint.lintText(PROBE, { filePath: 'shared/engine/probe.ts' });
    const found = result!.messages.map((m) => `${m.line}:${m.ruleId}`);
    expect(found).toEqual([
      '1:no-restricted-imports',
      '2:no-restricted-imports',
      '6:no-restricted-globals',
      '7:no-restricted-globals',
      '8:no-restricted-globals',
      '9:no-restricted-globals',
      '10:no-restricted-globals',
      '11:no-restricted-globals',
      '12:no-restricted-properties',
      '13:no-restricted-syntax',
      '14:no-restricted-properties',
      '15:no-restricted-globals',
    ]);
    // The same text outside shared/ is ordinary code.
    const [elsewhere] = await eslint.lintText(PROBE, { filePath: 'server/probe.ts' });
    expect(elsewhere!.messages.filter((m) => m.ruleId?.startsWith('no-restricted'))).toEqual([]);
  }, 60_000);

  it('is typechecked without Node or DOM types', () => {
    const config = JSON.parse(readFileSync('tsconfig.shared.json', 'utf8')) as { compilerOptions: { lib: string[]; types: string[] }; include: string[] };
    expect(config.include).toEqual(['shared']);
    expect(config.compilerOptions.types).toEqual([]);
    expect(config.compilerOptions.lib.some((lib) => /dom/i.test(lib))).toBe(false);
    const scripts = (JSON.parse(readFileSync('package.json', 'utf8')) as { scripts: Record<string, string> }).scripts;
    expect(scripts.typecheck).toContain('tsc --noEmit -p tsconfig.shared.json');
  });
});

/** Every relative import of every module under `dir`, resolved to a file. */
function importGraph(dir: string): Map<string, string[]> {
  const files: string[] = [];
  const walk = (d: string): void => {
    for (const name of readdirSync(d)) {
      const p = path.join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (p.endsWith('.ts')) files.push(p);
    }
  };
  walk(dir);
  const graph = new Map<string, string[]>();
  for (const file of files) {
    const targets = ts
      .preProcessFile(readFileSync(file, 'utf8'), true, true)
      .importedFiles.filter((i) => i.fileName.startsWith('.'))
      .map((i) => path.join(path.dirname(file), i.fileName))
      .map((t) => (existsSync(`${t}.ts`) ? `${t}.ts` : path.join(t, 'index.ts')));
    graph.set(file, targets);
  }
  return graph;
}

function circles(graph: Map<string, string[]>): string[] {
  const found: string[] = [];
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (file: string): void => {
    state.set(file, 'open');
    stack.push(file);
    for (const next of graph.get(file) ?? []) {
      if (state.get(next) === 'open') found.push([...stack.slice(stack.indexOf(next)), next].join(' -> '));
      else if (!state.has(next)) visit(next);
    }
    stack.pop();
    state.set(file, 'done');
  };
  for (const file of graph.keys()) if (!state.has(file)) visit(file);
  return found;
}

describe('the modules of shared/', () => {
  it('import each other without circles', () => {
    const graph = importGraph('shared');
    expect(graph.size).toBeGreaterThan(100);
    expect(circles(graph)).toEqual([]);
  });

  it('are checked for circles by a check that finds one', () => {
    const graph = new Map([
      ['a.ts', ['b.ts']],
      ['b.ts', ['c.ts']],
      ['c.ts', ['a.ts']],
    ]);
    expect(circles(graph)).toEqual(['a.ts -> b.ts -> c.ts -> a.ts']);
  });
});
