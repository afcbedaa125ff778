/**
 * Builds one migrated PGlite database per test run (initdb in WASM takes 3.5–5 s, STACK.md), dumps
 * it under `.tmp/`, and hands the path to the test files, which each load a fresh copy (~0.6 s).
 */
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { openDatabase } from '../../server/db/client';

declare module 'vitest' {
  export interface ProvidedContext {
    /** Path of the migrated template database dump (an uncompressed tar). */
    templateDumpPath: string;
  }
}

export default async function setup(project: TestProject): Promise<() => void> {
  const dir = path.resolve('.tmp');
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `api-template-${process.pid}.tar`);
  const database = await openDatabase({ kind: 'memory' });
  const dump = await database.dump!();
  writeFileSync(file, Buffer.from(await dump.arrayBuffer()));
  await database.close();
  project.provide('templateDumpPath', file);
  return () => rmSync(file, { force: true });
}
