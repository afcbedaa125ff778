/**
 * The DATA_DIR lock under a real race: two processes running the lock code reach it at the same
 * instant (each spins until a shared wall-clock moment; see `helpers/lockContender.ts`), 50 times
 * on a free directory and 50 times on a directory whose lock was left by a dead process. Exactly
 * one may win each time. `serverLockRace.test.ts` does the same with whole server processes.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LOCK_FILE_NAME } from '../../server/dataDirLock';
import type { ContenderCommand, ContenderReply } from './helpers/lockContender';

const TRIALS = 50;
const root = mkdtempSync(path.join(os.tmpdir(), 'rungwright-lock-race-'));

interface Contender {
  child: ChildProcess;
  pid: number;
  next(): Promise<ContenderReply>;
  send(command: ContenderCommand): void;
}

function startContender(): Promise<Contender> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'tests/api/helpers/lockContender.ts'], { stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
  const queue: ContenderReply[] = [];
  const waiting: ((reply: ContenderReply) => void)[] = [];
  child.on('message', (reply: ContenderReply) => {
    const resolve = waiting.shift();
    if (resolve) resolve(reply);
    else queue.push(reply);
  });
  const next = () => (queue.length > 0 ? Promise.resolve(queue.shift()!) : new Promise<ContenderReply>((resolve) => waiting.push(resolve)));
  return next().then((ready) => {
    if (ready.type !== 'ready') throw new Error(`contender said ${ready.type} first`);
    return { child, pid: ready.pid, next, send: (command) => child.send(command) };
  });
}

/** A pid no process has: a child that has already exited. */
function deadPid(): number {
  const done = spawnSync(process.execPath, ['-e', '']);
  return done.pid;
}

let contenders: Contender[] = [];
beforeAll(async () => {
  contenders = await Promise.all([startContender(), startContender()]);
}, 30_000);
afterAll(() => {
  for (const c of contenders) c.send({ type: 'exit' });
  rmSync(root, { recursive: true, force: true });
});

/** One trial: both contenders try at the same instant; returns how many won and the answers. */
async function trial(dir: string) {
  const at = Date.now() + 40;
  for (const c of contenders) c.send({ type: 'try', dir, at });
  const results = await Promise.all(contenders.map((c) => c.next()));
  const answers = results.map((r, i) => {
    if (r.type !== 'result') throw new Error(`contender answered ${r.type}`);
    return { ...r, pid: contenders[i]!.pid };
  });
  const winners = answers.filter((a) => a.won);
  // Release while both are still alive, so the next trial starts on a free directory.
  for (const [i, a] of answers.entries()) {
    if (!a.won) continue;
    contenders[i]!.send({ type: 'release' });
    await contenders[i]!.next();
  }
  return { answers, winners };
}

describe('the DATA_DIR lock raced by two processes at the same instant', () => {
  it(`lets exactly one of two simultaneous starters take a free directory, ${TRIALS} times out of ${TRIALS}`, async () => {
    const winnersPerTrial: number[] = [];
    const late: number[] = [];
    const badMessages: string[] = [];
    for (let n = 0; n < TRIALS; n += 1) {
      const dir = path.join(root, `free-${n}`);
      const { answers, winners } = await trial(dir);
      winnersPerTrial.push(winners.length);
      // How far apart the two reached the lock: the race is only real when this is small.
      late.push(Math.abs(answers[0]!.lateByMs - answers[1]!.lateByMs));
      const loser = answers.find((a) => !a.won);
      if (winners.length === 1 && !(loser?.error?.includes(path.resolve(dir)) && loser.error.includes(`pid ${winners[0]!.pid}`))) badMessages.push(loser?.error ?? '');
    }
    console.log(`free directory: winners per trial ${JSON.stringify(tally(winnersPerTrial))}; the two reached the lock ${[...late].sort((a, b) => a - b)[Math.floor(late.length / 2)]} ms apart (median), ${Math.max(...late)} ms at most`);
    expect(winnersPerTrial).toEqual(Array(TRIALS).fill(1));
    // The loser names the directory and the winner's pid.
    expect(badMessages).toEqual([]);
  }, 60_000);

  it(`lets exactly one of two simultaneous starters take over a lock left by a dead process, ${TRIALS} times out of ${TRIALS}`, async () => {
    const winnersPerTrial: number[] = [];
    const badMessages: string[] = [];
    const pid = deadPid();
    for (let n = 0; n < TRIALS; n += 1) {
      const dir = path.join(root, `stale-${n}`);
      mkdirSync(dir, { recursive: true });
      const stale = { pid, startedAt: `2026-01-01T00:00:${String(n).padStart(2, '0')}.000Z` };
      writeFileSync(path.join(dir, LOCK_FILE_NAME), JSON.stringify(stale));
      const { answers, winners } = await trial(dir);
      winnersPerTrial.push(winners.length);
      const loser = answers.find((a) => !a.won);
      if (winners.length === 1 && !loser?.error?.includes(`pid ${winners[0]!.pid}`)) badMessages.push(loser?.error ?? '');
    }
    console.log(`stale lock: winners per trial ${JSON.stringify(tally(winnersPerTrial))}`);
    expect(winnersPerTrial).toEqual(Array(TRIALS).fill(1));
    expect(badMessages).toEqual([]);
    // Every takeover cleaned up after itself: no claim or temporary file is left.
    for (let n = 0; n < TRIALS; n += 1) expect(readdirSync(path.join(root, `stale-${n}`))).toEqual([]);
  }, 60_000);

  it('leaves nothing behind in DATA_DIR once the winner has released the lock', () => {
    const dir = path.join(root, 'free-0');
    expect(existsSync(path.join(dir, LOCK_FILE_NAME))).toBe(false);
    expect(readdirSync(dir)).toEqual([]);
  });
});

function tally(values: number[]): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const v of values) counts[`${v} winner${v === 1 ? '' : 's'}`] = (counts[`${v} winner${v === 1 ? '' : 's'}`] ?? 0) + 1;
  return counts;
}
