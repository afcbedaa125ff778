import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createProgramAs, documentWithRungs, person, type Person } from './helpers/fixtures';

let t: TestApp;
let owner: Person;
beforeAll(async () => {
  t = await createTestApp();
  owner = await person(t, 'racer@test.example', 'student');
});
afterAll(() => t.close());

describe('concurrent saves', () => {
  it('lets exactly one of two saves on the same base win; the other gets 409 and no version is lost', async () => {
    const id = await createProgramAs(t, owner);
    const save = (n: number) => call(t, 'post', `/api/programs/${id}/versions`, owner.cookie).send({ baseVersion: 1, document: documentWithRungs(n), message: `save ${n}` });
    const results = await Promise.all([save(2), save(3)]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    const winner = results.find((r) => r.status === 201)!;
    const loser = results.find((r) => r.status === 409)!;
    expect(loser.body.error.details.head.number).toBe(2);

    const versions = (await call(t, 'get', `/api/programs/${id}/versions`, owner.cookie)).body.versions;
    expect(versions.map((v: { number: number }) => v.number)).toEqual([2, 1]);
    const head = await call(t, 'get', `/api/programs/${id}`, owner.cookie);
    expect(head.body.head.document).toEqual(winner.body.version.document);
  });

  it('keeps a gap-free version history when 12 clients race, each retrying on 409', async () => {
    const id = await createProgramAs(t, owner);
    const client = async (n: number) => {
      let base = 1;
      for (;;) {
        const res = await call(t, 'post', `/api/programs/${id}/versions`, owner.cookie).send({ baseVersion: base, document: documentWithRungs(1 + (n % 3)), message: `client ${n}` });
        if (res.status === 201) return res.body.version.number as number;
        expect(res.status).toBe(409);
        base = res.body.error.details.head.number;
      }
    };
    const acknowledged = await Promise.all(Array.from({ length: 12 }, (_, n) => client(n)));
    expect([...acknowledged].sort((a, b) => a - b)).toEqual(Array.from({ length: 12 }, (_, i) => i + 2));
    const versions = (await call(t, 'get', `/api/programs/${id}/versions`, owner.cookie)).body.versions;
    expect(versions).toHaveLength(13);
    expect(new Set(versions.map((v: { message: string }) => v.message)).size).toBe(13);
  });
});
