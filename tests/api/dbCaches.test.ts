/**
 * The db layer's row caches and grouped saves (server/db/rowCache.ts, versionBatches.ts) on a real
 * PGlite: whatever is cached, a read after a write answers what the database holds.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { openTemplateDatabase } from './helpers/testApp';
import type { Database } from '../../server/db/client';
import * as programs from '../../server/db/programs';
import { findUserByEmail, findUserById, insertUser, setLastSignIn } from '../../server/db/users';
import { deleteLab, insertLab } from '../../server/db/labs';
import { insertClass } from '../../server/db/classes';
import { documentWithRungs } from './helpers/fixtures';
import { rowCachesOf } from '../../server/db/rowCache';
import { programs as programsTable } from '../../server/db/schema';

let database: Database;
let ownerId: string;
const now = new Date('2026-09-01T08:00:00Z');

beforeAll(async () => {
  database = await openTemplateDatabase();
  const user = await insertUser(database.orm, { email: 'cache.owner@test.example', name: 'Cache Owner', role: 'instructor', passwordHash: 'x', createdAt: now });
  ownerId = user!.id;
});
afterAll(() => database.close());

async function newProgram(title = 'Cached'): Promise<string> {
  const { program } = await programs.insertProgram(database.orm, { ownerId, title, document: documentWithRungs(1), message: 'Created', authorId: ownerId, now });
  return program.id;
}

const save = (programId: string, baseVersion: number, rungs = 2, authorId = ownerId) =>
  programs.appendVersion(database.orm, { programId, baseVersion, document: documentWithRungs(rungs), message: `on ${baseVersion}`, authorId, now });

describe('row caches', () => {
  it('are on for the database this process owns', () => {
    expect(rowCachesOf(database.orm)).toBeDefined();
  });

  it('answer a program as renamed, saved and deleted', async () => {
    const id = await newProgram();
    expect((await programs.findProgram(database.orm, id))?.title).toBe('Cached');
    await programs.renameProgram(database.orm, id, 'Renamed', now);
    expect((await programs.findProgram(database.orm, id))?.title).toBe('Renamed');
    const saved = await save(id, 1);
    expect(saved.ok).toBe(true);
    expect((await programs.findProgram(database.orm, id))?.headVersion).toBe(2);
    expect((await programs.findVersion(database.orm, id, 2))?.document).toEqual(documentWithRungs(2));
    await programs.deleteProgram(database.orm, id);
    expect(await programs.findProgram(database.orm, id)).toBeNull();
    expect(await programs.findVersion(database.orm, id, 1)).toBeNull();
  });

  it('keep a version\'s document as its JSON text, and hand each reader a tree of its own', async () => {
    const id = await newProgram();
    expect((await save(id, 1, 3)).ok).toBe(true);
    const cached = rowCachesOf(database.orm)!.versions.peek(`${id}#2`);
    expect(cached?.documentJson).toBe(JSON.stringify(documentWithRungs(3)));
    expect(cached).not.toHaveProperty('document');
    const first = await programs.findVersion(database.orm, id, 2);
    (first!.document as { rungs: unknown[] }).rungs.length = 0;
    expect((await programs.findVersion(database.orm, id, 2))?.document).toEqual(documentWithRungs(3));
    // Read from the database (jsonb orders keys its own way): the text is what res.json sends for the row.
    rowCachesOf(database.orm)!.versions.clear();
    const loaded = await programs.findVersionJson(database.orm, id, 2);
    const [stored] = await database.orm.execute(sql`select document from program_versions where program_id = ${id} and number = 2`).then((r) => (r as unknown as { rows: { document: unknown }[] }).rows);
    expect(loaded?.documentJson).toBe(JSON.stringify(stored!.document));
    expect(JSON.parse(loaded!.documentJson)).toEqual(documentWithRungs(3));
  });

  it('answer the same program the database holds after every save', async () => {
    const id = await newProgram();
    for (let base = 1; base <= 5; base += 1) expect((await save(id, base)).ok).toBe(true);
    const cached = await programs.findProgram(database.orm, id);
    const [stored] = await database.orm.select().from(programsTable).where(sql`${programsTable.id} = ${id}`);
    expect(cached).toEqual(stored);
  });

  it('forget the lab of a program when the lab is deleted (the foreign key clears it)', async () => {
    const cls = (await insertClass(database.orm, { name: 'Cache class', term: 'Fall', instructorId: ownerId, joinCode: 'CACHE-TEST-1', now }))!;
    const lab = await insertLab(database.orm, { classId: cls.id, authorId: ownerId, title: 'Cache lab', createdAt: now, updatedAt: now });
    const { program } = await programs.insertProgram(database.orm, { ownerId, title: 'In a lab', labId: lab.id, document: documentWithRungs(1), message: 'Created', authorId: ownerId, now });
    expect((await programs.findProgram(database.orm, program.id))?.labId).toBe(lab.id);
    await deleteLab(database.orm, lab.id);
    expect((await programs.findProgram(database.orm, program.id))?.labId).toBeNull();
  });

  it('answer a user with the last sign-in just written', async () => {
    const user = await findUserByEmail(database.orm, 'cache.owner@test.example');
    expect((await findUserById(database.orm, user!.id))?.lastSignInAt).toBeNull();
    const at = new Date('2026-09-02T09:30:00Z');
    await setLastSignIn(database.orm, user!.id, at);
    expect((await findUserById(database.orm, user!.id))?.lastSignInAt).toEqual(at);
  });

  it('are not used inside a transaction, which reads its own writes', async () => {
    const id = await newProgram('Before');
    await programs.findProgram(database.orm, id);
    const seen = await database.orm.transaction(async (tx) => {
      await tx.update(programsTable).set({ title: 'Inside' }).where(sql`${programsTable.id} = ${id}`);
      return programs.findProgram(tx, id);
    });
    expect(seen?.title).toBe('Inside');
  });
});

describe('grouped saves', () => {
  it('give each of many simultaneous saves on different programs its own next version', async () => {
    const ids = await Promise.all(Array.from({ length: 40 }, (_, i) => newProgram(`Batch ${i}`)));
    const results = await Promise.all(ids.map((id) => save(id, 1)));
    expect(results.every((r) => r.ok && r.version.number === 2)).toBe(true);
    for (const id of ids) expect((await programs.listVersions(database.orm, id)).map((v) => v.number)).toEqual([2, 1]);
  });

  it('let exactly one of several simultaneous saves on the same base win, and tell the others the head', async () => {
    const id = await newProgram();
    const results = await Promise.all([save(id, 1, 2), save(id, 1, 3), save(id, 1, 4)]);
    expect(results.filter((r) => r.ok)).toHaveLength(1);
    for (const lost of results.filter((r) => !r.ok)) expect(lost.ok ? null : lost.head?.number).toBe(2);
    expect((await programs.listVersions(database.orm, id)).map((v) => v.number)).toEqual([2, 1]);
  });

  it('keep one failing save from failing the others in its batch', async () => {
    const good = await newProgram();
    const bad = await newProgram();
    const noSuchAuthor = '00000000-0000-4000-8000-000000000000';
    const [ok, refused] = await Promise.allSettled([save(good, 1), save(bad, 1, 2, noSuchAuthor)]);
    expect(ok.status === 'fulfilled' && ok.value.ok).toBe(true);
    expect(refused.status).toBe('rejected');
    expect((await programs.findProgram(database.orm, bad))?.headVersion).toBe(1);
  });

  it('report a missing program as having no head', async () => {
    const result = await save('00000000-0000-4000-8000-000000000001', 1);
    expect(result).toEqual({ ok: false, head: null });
  });
});
