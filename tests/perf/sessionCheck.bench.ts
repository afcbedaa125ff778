/**
 * The session check's cost on every signed-in request, in-process on PGlite (`authenticate`: the
 * token's signature, remembered, then its session row and user), three ways:
 * - as shipped on PGlite, where this process alone writes the database: the row and the user
 *   through the row caches (revocations drop the cached row);
 * - as on a database several processes share (no row caches): the row joined with its user, one
 *   query per request;
 * - before session rows existed: the same token check, then the cached user (no query).
 * Rounds of each alternate, so a shared machine's load falls on all alike; figures are the median
 * per request over the rounds, in CPU time (process.cpuUsage) and wall time.
 */
import type { Request, Response } from 'express';
import type { BenchCase } from './run';
import { median, round } from './stats';
import { drizzle } from 'drizzle-orm/pglite';
import type { PGlite } from '@electric-sql/pglite';
import { openDatabase, type Db } from '../../server/db/client';
import * as schema from '../../server/db/schema';
import { findUserById, insertUser } from '../../server/db/users';
import { insertSession } from '../../server/db/sessions';
import { readSessionCookie, signSession, verifySession } from '../../server/auth/session';
import { authenticate } from '../../server/http/authenticate';
import type { AppContext } from '../../server/context';

const ROUNDS = 15;
const CALLS_PER_ROUND = 400;

async function timeRound(call: () => Promise<unknown>): Promise<{ cpuUs: number; wallUs: number }> {
  const cpu = process.cpuUsage();
  const wall = process.hrtime.bigint();
  for (let i = 0; i < CALLS_PER_ROUND; i += 1) await call();
  const used = process.cpuUsage(cpu);
  return { cpuUs: (used.user + used.system) / CALLS_PER_ROUND, wallUs: Number(process.hrtime.bigint() - wall) / 1000 / CALLS_PER_ROUND };
}

export default async function (): Promise<BenchCase[]> {
  const database = await openDatabase({ kind: 'memory' });
  try {
    const now = new Date();
    const key = new TextEncoder().encode('bench-session-key-0123456789abcdef');
    const user = await insertUser(database.orm, { email: 'bench@test.example', name: 'Bench', role: 'student', passwordHash: 'x', createdAt: now });
    if (!user) throw new Error('bench user not created');
    // A table of a busy installation: a few thousand open sessions.
    for (let i = 0; i < 2000; i += 1) await insertSession(database.orm, { userId: user.id, now, expiresAt: new Date(now.getTime() + 3_600_000) });
    const sessionId = await insertSession(database.orm, { userId: user.id, now, expiresAt: new Date(now.getTime() + 3_600_000) });
    const cookie = `rw_session=${await signSession({ userId: user.id, sessionId }, key, now)}`;

    const checkOn = (orm: Db) => {
      const check = authenticate({ orm, sessionKey: key, clock: { now: () => new Date() } } as unknown as AppContext);
      return async () => {
        const req = { headers: { cookie } } as Request;
        await new Promise<void>((resolve) => void check(req, {} as Response, () => resolve()));
        if (!req.user) throw new Error('the session check refused a good session');
      };
    };
    const cachedRow = checkOn(database.orm);
    // A second handle on the same database, without row caches: what a shared database gets.
    const sharedOrm = drizzle({ client: (database.orm as unknown as { $client: PGlite }).$client, schema }) as unknown as Db;
    const joinedRow = checkOn(sharedOrm);
    const cachedUserOnly = async () => {
      const claims = await verifySession(readSessionCookie(cookie)!, key, new Date());
      if (!claims || !(await findUserById(database.orm, claims.userId))) throw new Error('no user');
    };

    const paths = {
      'session check per request, PGlite as shipped (session row and user through the row caches)': cachedRow,
      'session check per request, shared database (session row joined with its user, one query)': joinedRow,
      'session check per request before session rows (signature memo + cached user, no query)': cachedUserOnly,
    };
    // Warm every path (JIT, the token memo, the row caches) before measuring.
    for (const path of Object.values(paths)) await timeRound(path);
    const rounds = new Map<string, { cpuUs: number; wallUs: number }[]>(Object.keys(paths).map((name) => [name, []]));
    for (let r = 0; r < ROUNDS; r += 1) {
      for (const [name, path] of Object.entries(paths)) rounds.get(name)!.push(await timeRound(path));
    }
    const before = median(rounds.get(Object.keys(paths)[2]!)!.map((x) => x.cpuUs));
    return [...rounds].map(([name, samples]) => {
      const cpu = median(samples.map((x) => x.cpuUs));
      return {
        case: name,
        calls: ROUNDS * CALLS_PER_ROUND,
        cpuUsPerRequest: round(cpu, 1),
        wallUsPerRequest: round(median(samples.map((x) => x.wallUs)), 1),
        cpuUsAddedOverBefore: round(cpu - before, 1),
      };
    });
  } finally {
    await database.close();
  }
}
