/**
 * Two real server processes started at the same instant on one DATA_DIR: exactly one serves, the
 * other exits at once naming the directory and the winner's pid. Half the trials start on a lock
 * left by a dead server, so both must decide it is stale and race to take it over.
 *
 * `helpers/startTogether.ts` (preloaded, test-only) makes both processes reach the lock within a
 * few milliseconds of each other. Each trial costs two process starts, so the default is 4 trials
 * (the lock code alone is raced 100 times in `dataDirLockRace.test.ts`);
 * `LOCK_RACE_SERVER_TRIALS=50` runs more.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { LOCK_FILE_NAME } from '../../server/dataDirLock';
import { makeTempDataDir } from './helpers/serverProcess';

const TRIALS = Number(process.env.LOCK_RACE_SERVER_TRIALS ?? 4);
const dataDir = makeTempDataDir();
const goFile = path.join(dataDir, '..', `${path.basename(dataDir)}.go`);
const started: ChildProcess[] = [];

afterAll(() => {
  for (const child of started) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  rmSync(dataDir, { recursive: true, force: true });
  rmSync(goFile, { force: true });
});

type Outcome =
  | { kind: 'listening'; pid: number; child: ChildProcess; exited: Promise<number | string>; stderr: string }
  | { kind: 'exited'; pid: number; code: number | string; stderr: string };

interface Racer {
  ready: Promise<void>;
  outcome: Promise<Outcome>;
}

function racer(): Racer {
  const child = spawn(process.execPath, ['--import', 'tsx', '--import', './tests/api/helpers/startTogether.ts', 'server/index.ts'], {
    cwd: path.resolve('.'),
    env: { ...process.env, DATA_DIR: dataDir, PORT: '0', HOST: '127.0.0.1', LOG_LEVEL: 'warn', NODE_ENV: 'test', DEMO: 'off', RACE_GO_FILE: goFile },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  started.push(child);
  const pid = child.pid ?? -1;
  let out = '';
  let err = '';
  const exited = new Promise<number | string>((done) => child.on('exit', (code, signal) => done(code ?? signal ?? -1)));
  child.stderr.on('data', (chunk: Buffer) => (err += chunk.toString()));
  const ready = new Promise<void>((resolve, reject) => {
    child.stdout.on('data', (chunk: Buffer) => {
      out += chunk.toString();
      if (out.includes('ready\n')) resolve();
    });
    void exited.then((code) => reject(new Error(`racer exited (${code}) before it was ready: ${err}`)));
  });
  const outcome = new Promise<Outcome>((resolve) => {
    child.stdout.on('data', () => {
      if (/Rungwright listening on/.test(out)) resolve({ kind: 'listening', pid, child, exited, stderr: err });
    });
    void exited.then((code) => resolve({ kind: 'exited', pid, code, stderr: err }));
  });
  return { ready, outcome };
}

/** The pid of a process that has already exited. */
const deadPid = (): number => spawnSync(process.execPath, ['-e', '']).pid;

describe('two real servers started at the same instant on one DATA_DIR', () => {
  it(`lets exactly one serve and makes the other exit naming the directory and the winner's pid, ${TRIALS} times`, async () => {
    const report: string[] = [];
    const gapsMs: number[] = [];
    const problems: string[] = [];
    const stalePid = deadPid();
    for (let n = 0; n < TRIALS; n += 1) {
      const stale = n % 2 === 1;
      if (stale) writeFileSync(path.join(dataDir, LOCK_FILE_NAME), JSON.stringify({ pid: stalePid, startedAt: `2026-01-01T00:00:${String(n).padStart(2, '0')}.000Z` }));
      rmSync(goFile, { force: true });
      const racers = [racer(), racer()];
      await Promise.all(racers.map((r) => r.ready));
      writeFileSync(`${goFile}.tmp`, String(Date.now() + 50));
      renameSync(`${goFile}.tmp`, goFile);
      const outcomes = await Promise.all(racers.map((r) => r.outcome));
      const winners = outcomes.filter((o) => o.kind === 'listening');
      const losers = outcomes.filter((o) => o.kind === 'exited');
      report.push(`${winners.length}`);
      // How far apart the two reached the lock: the race is only real when this is small.
      const [lateA, lateB] = outcomes.map((o) => Number(/reached the instant (\d+) ms late/.exec(o.stderr)?.[1] ?? NaN));
      gapsMs.push(Math.abs(lateA! - lateB!));
      if (winners.length !== 1) problems.push(`trial ${n + 1}${stale ? ' (stale lock)' : ''}: ${winners.length} servers started`);
      for (const loser of losers) {
        if (winners.length !== 1) break;
        const message = loser.stderr.split('\n').find((line) => line.startsWith('DATA_DIR')) ?? loser.stderr;
        if (loser.code !== 1 || !message.includes(path.resolve(dataDir)) || !message.includes(`pid ${winners[0]!.pid}`)) {
          problems.push(`trial ${n + 1}: the loser exited ${loser.code} with: ${loser.stderr}`);
        }
      }
      for (const winner of winners) {
        winner.child.kill('SIGTERM');
        await winner.exited;
      }
      if (existsSync(path.join(dataDir, LOCK_FILE_NAME))) problems.push(`trial ${n + 1}: the lock file outlived its server`);
    }
    const sorted = [...gapsMs].sort((a, b) => a - b);
    console.log(`real servers: winners per trial ${report.join(' ')}; the two reached the lock ${sorted[Math.floor(sorted.length / 2)]} ms apart (median), ${sorted.at(-1)} ms at most`);
    expect(problems).toEqual([]);
  }, 60_000 + TRIALS * 45_000);
});
