import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { bootReadsFor, createBootReads } from '@/api/bootReads';
import { createHttp } from '@/api/http';
import { fakeFetch } from './fakeFetch';

const PROGRAM_ID = '5f0e8a52-6a55-4f43-9a57-31b1c9d0a001';

describe('reads sent at boot', () => {
  it('asks for the session on every page and for the program on the workbench', () => {
    expect(bootReadsFor('/sign-in')).toEqual(['/api/me']);
    expect(bootReadsFor('/programs')).toEqual(['/api/me']);
    expect(bootReadsFor(`/programs/${PROGRAM_ID}`)).toEqual(['/api/me', `/api/programs/${PROGRAM_ID}`]);
    expect(bootReadsFor(`/programs/${PROGRAM_ID}/`)).toEqual(['/api/me', `/api/programs/${PROGRAM_ID}`]);
    expect(bootReadsFor(`/programs/${PROGRAM_ID}/extra`)).toEqual(['/api/me']);
    expect(bootReadsFor('/programs/a%2Fb')).toEqual(['/api/me', '/api/programs/a%2Fb']);
    expect(bootReadsFor('/programs/%E0%A4%A')).toEqual(['/api/me']);
  });

  it('hands the client the answer already sent, once, and asks the server for the next read', async () => {
    let served = 0;
    const fetch = fakeFetch(() => ({ status: 200, body: { served: (served += 1) } }));
    const boot = createBootReads(fetch.impl);
    boot.start(`/programs/${PROGRAM_ID}`);
    expect(fetch.calls.map((c) => [c.method, c.url, c.headers.Accept])).toEqual([
      ['GET', '/api/me', 'application/json'],
      ['GET', `/api/programs/${PROGRAM_ID}`, 'application/json'],
    ]);
    const http = createHttp({ fetchImpl: boot.fetch });
    expect(await http.json(`/api/programs/${PROGRAM_ID}`, z.unknown())).toEqual({ served: 2 });
    expect(fetch.calls).toHaveLength(2);
    expect(await http.json(`/api/programs/${PROGRAM_ID}`, z.unknown())).toEqual({ served: 3 });
    expect(fetch.calls).toHaveLength(3);
  });

  it('drops unclaimed answers on a write, so a read after it is fresh', async () => {
    let served = 0;
    const fetch = fakeFetch(() => ({ status: 200, body: { served: (served += 1) } }));
    const boot = createBootReads(fetch.impl);
    boot.start('/sign-in');
    const http = createHttp({ fetchImpl: boot.fetch });
    await http.json('/api/auth/sign-in', z.unknown(), { method: 'POST', body: {} });
    expect(await http.json('/api/me', z.unknown())).toEqual({ served: 3 });
    expect(fetch.calls.map((c) => `${c.method} ${c.url}`)).toEqual(['GET /api/me', 'POST /api/auth/sign-in', 'GET /api/me']);
  });

  it('drops unclaimed answers when told (leaving the first page)', async () => {
    const fetch = fakeFetch(() => ({ status: 200, body: {} }));
    const boot = createBootReads(fetch.impl);
    boot.start(`/programs/${PROGRAM_ID}`);
    boot.drop();
    await boot.fetch(`/api/programs/${PROGRAM_ID}`, { method: 'GET' });
    expect(fetch.calls).toHaveLength(3);
  });

  it('passes a failed boot read on to its claimer and never reports it unclaimed', async () => {
    const fetch = fakeFetch(() => 'network-down');
    const boot = createBootReads(fetch.impl);
    boot.start('/sign-in');
    const failure = await createHttp({ fetchImpl: boot.fetch })
      .json('/api/me', z.unknown())
      .catch((e: unknown) => e);
    expect(failure).toMatchObject({ code: 'network' });
    boot.start('/sign-in');
    boot.drop();
    // An unhandled rejection here would fail the run (vitest reports it).
    await new Promise((resolve) => setTimeout(resolve, 0));
  });
});
