import { mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { clientBuildIsStale } from '../../../server/clientBuild';

let root: string;
const at = (seconds: number) => new Date(1_700_000_000_000 + seconds * 1000);
function touch(file: string, seconds: number): void {
  mkdirSync(path.dirname(path.join(root, file)), { recursive: true });
  writeFileSync(path.join(root, file), 'x');
  utimesSync(path.join(root, file), at(seconds), at(seconds));
}

beforeEach(() => {
  root = mkdtempSync(path.join(tmpdir(), 'rw-build-'));
});
afterEach(() => rmSync(root, { recursive: true, force: true }));

describe('deciding whether npm start must build the client', () => {
  it('builds when there is no build yet', () => {
    touch('src/main.ts', 10);
    expect(clientBuildIsStale(root)).toBe(true);
  });

  it('does not build when the build is newer than every source', () => {
    touch('src/main.ts', 10);
    touch('shared/ladder/schema.ts', 20);
    touch('dist/index.html', 30);
    for (const dir of ['src', 'shared', 'shared/ladder', 'dist']) utimesSync(path.join(root, dir), at(5), at(5));
    expect(clientBuildIsStale(root)).toBe(false);
  });

  it('builds again when a source in a nested folder changed after the build', () => {
    touch('dist/index.html', 30);
    touch('src/components/editor/RungCanvas.vue', 40);
    expect(clientBuildIsStale(root)).toBe(true);
  });
});
