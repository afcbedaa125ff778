/**
 * A program's proof sheet: the properties its owner asked the prover to decide and the checks kept
 * from counterexamples, stored per program. Owner only (like a draft: even the instructor who may
 * read a lab copy does not see it), checked by the shared schema, gone with its program.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { getTableConfig } from 'drizzle-orm/pg-core';
import { FORWARD_REVERSE } from '@shared/labs';
import { MAX_SAVED_CHECKS, MAX_SHEET_PROPERTIES, ProofSheetResponseSchema } from '@shared/api/proof';
import { propertyLabel, type Property } from '@shared/proof';
import { proofSheets } from '../../server/db/schema';
import { tablesInCopyOrder } from '../../server/cli/exportDb';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, createProgramAs, type Cast } from './helpers/fixtures';
import { labFromTemplate, publish, saveInCopy } from './labsFixtures';

let t: TestApp;
let cast: Cast;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
});
afterAll(() => t.close());

const owner = () => cast.studentA.cookie;
const sheetOf = (id: string, cookie: string | null = owner()) => call(t, 'get', `/api/programs/${id}/proof`, cookie);
const putSheet = (id: string, body: unknown, cookie: string | null = owner()) => call(t, 'put', `/api/programs/${id}/proof`, cookie).send(body as object);

/** One property of each kind; the `never` names its devices out of alphabetical order on purpose. */
const PROPERTIES: Property[] = [
  { never: { K2: 'closed', K1: 'closed' } },
  { always: { '%QX1': false, '%QX2': false }, when: { S0: 'pressed' }, label: 'e-stop drops both' },
  { after: { H1: 'sounding' }, within: 3000, expect: { H1: 'silent' } },
  { reachable: { 'T1.ET': { min: 100, max: 2999 } } },
];

/** A counterexample kept as a check: the shape `prove` writes (panel, scan, no settling, steps). */
const COUNTEREXAMPLE = {
  label: 'K1 and K2 together',
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    settleMs: 0,
    steps: [{ press: 'S1' }, { press: 'S2' }, { wait: 10 }, { expect: { K2: 'closed', K1: 'closed' }, label: 'never K2 closed and K1 closed' }],
  },
};

const SHEET = { properties: PROPERTIES, checks: [COUNTEREXAMPLE] };

describe('a program\'s proof sheet', () => {
  it('is empty, with no time, before anything was saved', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Nothing proved yet');
    const res = await sheetOf(id);
    expect(res.status).toBe(200);
    expect(ProofSheetResponseSchema.parse(res.body)).toEqual({ proof: { properties: [], checks: [] }, updatedAt: null });
  });

  it('keeps what was put, as written, and the time; a second put replaces the whole sheet', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Proved');
    t.clock.set(new Date('2026-09-01T13:00:00.000Z'));
    const put = await putSheet(id, SHEET);
    expect(put.status, put.text).toBe(200);
    expect(put.body).toEqual({ proof: SHEET, updatedAt: '2026-09-01T13:00:00.000Z' });

    const got = ProofSheetResponseSchema.parse((await sheetOf(id)).body);
    expect(got).toEqual({ proof: SHEET, updatedAt: '2026-09-01T13:00:00.000Z' });
    // The order of a condition's keys is the order its words come in: it survives the database.
    expect(Object.keys((got.proof.properties[0] as { never: object }).never)).toEqual(['K2', 'K1']);
    expect(propertyLabel(got.proof.properties[0]!)).toBe('never K2 closed and K1 closed');
    expect(Object.keys((got.proof.checks[0]!.script.steps[3] as { expect: object }).expect)).toEqual(['K2', 'K1']);

    t.clock.set(new Date('2026-09-01T13:05:00.000Z'));
    const second = { properties: [PROPERTIES[3]!], checks: [] };
    expect((await putSheet(id, second)).status).toBe(200);
    expect((await sheetOf(id)).body).toEqual({ proof: second, updatedAt: '2026-09-01T13:05:00.000Z' });
  });

  it('stores a saved check as the check-script schema reads it (defaults filled, label trimmed)', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Defaults');
    const res = await putSheet(id, { properties: [], checks: [{ label: '  seal-in holds  ', script: { steps: [{ press: 'S1' }, { expect: { '%QX1': true } }] } }] });
    expect(res.status, res.text).toBe(200);
    const check = (await sheetOf(id)).body.proof.checks[0];
    expect(check.label).toBe('seal-in holds');
    expect(check.script).toMatchObject({ panel: 'reversing-conveyor', scanMs: 10, settleMs: 100 });
  });

  it('is its owner\'s alone: the instructor who reads the lab copy, an admin and another student get 404 and change nothing', async () => {
    const { labId } = await labFromTemplate(t, cast.instructor, cast.classId, FORWARD_REVERSE.id);
    await publish(t, cast.instructor, labId);
    const { programId } = await saveInCopy(t, cast.studentA, labId, FORWARD_REVERSE.solution);
    expect((await putSheet(programId, SHEET)).status).toBe(200);
    // The instructor may read the program itself, not its proof sheet.
    expect((await call(t, 'get', `/api/programs/${programId}`, cast.instructor.cookie)).status).toBe(200);
    for (const other of [cast.instructor, cast.otherInstructor, cast.admin, cast.studentB]) {
      const read = await sheetOf(programId, other.cookie);
      expect(read.status).toBe(404);
      expect(read.body.error.code).toBe('not_found');
      expect((await putSheet(programId, { properties: [], checks: [] }, other.cookie)).status).toBe(404);
    }
    expect((await sheetOf(programId)).body.proof).toEqual(SHEET);
  });

  it('answers 401 when not signed in, 404 for a program that is not there or an id that is not one', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Anonymous');
    expect((await sheetOf(id, null)).status).toBe(401);
    expect((await putSheet(id, SHEET, null)).status).toBe(401);
    expect((await sheetOf('00000000-0000-4000-8000-000000000000')).status).toBe(404);
    expect((await putSheet('00000000-0000-4000-8000-000000000000', SHEET)).status).toBe(404);
    expect((await sheetOf('not-a-uuid')).status).toBe(404);
  });

  it('refuses a bad body with 400 naming the field by its path, keeping the previous sheet', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Bad bodies');
    await putSheet(id, SHEET);
    const cases: [unknown, string][] = [
      [{ properties: [] }, 'checks'],
      [{ checks: [] }, 'properties'],
      [{ properties: [{ sometimes: { K1: 'closed' } }], checks: [] }, 'properties.0'],
      [{ properties: [PROPERTIES[0], { after: { S1: 'pressed' }, within: -5, expect: { K1: 'open' } }], checks: [] }, 'properties.1.within'],
      [{ properties: [], checks: [{ label: '   ', script: COUNTEREXAMPLE.script }] }, 'checks.0.label'],
      [{ properties: [], checks: [COUNTEREXAMPLE, { label: 'no steps', script: { ...COUNTEREXAMPLE.script, steps: [] } }] }, 'checks.1.script.steps'],
      [{ properties: [], checks: [{ label: 'bad step', script: { steps: [{ wait: 'soon' }] } }] }, 'checks.0.script.steps.0'],
      [{ properties: [], checks: [], extra: true }, '(body)'],
    ];
    for (const [body, field] of cases) {
      const res = await putSheet(id, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation');
      expect(Object.keys(res.body.error.fields), JSON.stringify(body)).toContain(field);
      expect(res.body.error.message).toContain(field);
    }
    expect((await sheetOf(id)).body.proof).toEqual(SHEET);
  });

  it('refuses a body that is not JSON with 415', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Not JSON');
    const res = await call(t, 'put', `/api/programs/${id}/proof`, owner()).set('Content-Type', 'text/plain').send('never K1');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });

  it(`takes up to ${MAX_SHEET_PROPERTIES} properties and ${MAX_SAVED_CHECKS} saved checks, refuses one more of either (400) and a body over 1 MB (413)`, async () => {
    const id = await createProgramAs(t, cast.studentA, 'Limits');
    const props = (n: number) => Array.from({ length: n }, (_, i) => ({ never: { [`%QX${(i % 8) + 1}`]: true, '%IX1': false }, label: `property ${i + 1}` }));
    const checks = (n: number) => Array.from({ length: n }, (_, i) => ({ ...COUNTEREXAMPLE, label: `check ${i + 1}` }));
    const full = await putSheet(id, { properties: props(MAX_SHEET_PROPERTIES), checks: checks(MAX_SAVED_CHECKS) });
    expect(full.status, full.text).toBe(200);
    expect(full.body.proof.properties).toHaveLength(MAX_SHEET_PROPERTIES);
    expect(full.body.proof.checks).toHaveLength(MAX_SAVED_CHECKS);

    const tooManyProps = await putSheet(id, { properties: props(MAX_SHEET_PROPERTIES + 1), checks: [] });
    expect(tooManyProps.status).toBe(400);
    expect(tooManyProps.body.error.fields).toHaveProperty('properties');
    const tooManyChecks = await putSheet(id, { properties: [], checks: checks(MAX_SAVED_CHECKS + 1) });
    expect(tooManyChecks.status).toBe(400);
    expect(tooManyChecks.body.error.fields).toHaveProperty('checks');

    const huge = await putSheet(id, { properties: [{ never: { K1: 'closed' }, label: 'x' }], checks: [{ label: 'huge', script: { steps: [{ expect: { K1: 'x'.repeat(1024 * 1024 + 10) } }] } }] });
    expect(huge.status).toBe(413);
    expect(huge.body.error.code).toBe('payload_too_large');
    expect((await sheetOf(id)).body.proof.checks).toHaveLength(MAX_SAVED_CHECKS);
  });

  it('goes with its program when the program is deleted', async () => {
    const id = await createProgramAs(t, cast.studentA, 'Deleted');
    await putSheet(id, SHEET);
    const rows = () => t.database.orm.select().from(proofSheets).where(eq(proofSheets.programId, id));
    expect(await rows()).toHaveLength(1);
    expect((await call(t, 'delete', `/api/programs/${id}`, owner())).status).toBe(204);
    expect((await sheetOf(id)).status).toBe(404);
    expect(await rows()).toHaveLength(0);
  });
});

describe('export-db and proof sheets', () => {
  it('copies proof_sheets after the programs and users it references', () => {
    const names = tablesInCopyOrder().map((table) => getTableConfig(table).name);
    expect(names).toContain('proof_sheets');
    expect(names.indexOf('programs')).toBeLessThan(names.indexOf('proof_sheets'));
    expect(names.indexOf('users')).toBeLessThan(names.indexOf('proof_sheets'));
  });
});
