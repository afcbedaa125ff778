import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiErrorBodySchema } from '@shared/api/errors';
import { HealthResponseSchema } from '@shared/api/health';
import { createTestApp, onPostgres, type TestApp } from './helpers/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/health', () => {
  it('answers ok with the database driver and the package version', async () => {
    const res = await t.http.get('/api/health');
    expect(res.status).toBe(200);
    expect(HealthResponseSchema.parse(res.body)).toEqual({ ok: true, db: onPostgres() ? 'postgres' : 'pglite', version: '0.1.0' });
  });

  it('sends a request id and a content security policy without remote hosts', async () => {
    const res = await t.http.get('/api/health');
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    const csp = String(res.headers['content-security-policy']);
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/https?:/);
  });
});

describe('API errors', () => {
  it('answers an unknown /api path with a 404 JSON error, not HTML', async () => {
    const res = await t.http.get('/api/nope');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(ApiErrorBodySchema.parse(res.body).error).toMatchObject({ code: 'not_found' });
    expect(res.body.error.message).toContain('/api/nope');
  });

  it('answers a malformed JSON body with a 400 bad_json error, not an HTML page', async () => {
    const res = await t.http
      .post('/api/nope')
      .set('Origin', t.origin)
      .set('Content-Type', 'application/json')
      .send('{"title": ');
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(res.body.error.code).toBe('bad_json');
    expect(res.text).not.toMatch(/<html|at .*\.ts:/i);
  });

  it('answers a JSON body over 1 MB with 413', async () => {
    const big = JSON.stringify({ text: 'x'.repeat(1_100_000) });
    const res = await t.http.post('/api/nope').set('Origin', t.origin).set('Content-Type', 'application/json').send(big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('refuses a state-changing request from another site', async () => {
    const res = await t.http.post('/api/nope').set('Origin', 'http://evil.example').send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  it('refuses a state-changing request with neither Origin nor Referer', async () => {
    const res = await t.http.post('/api/nope').send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  it('accepts a same-site Referer when the Origin header is missing', async () => {
    const res = await t.http.post('/api/nope').set('Referer', `${t.origin}/programs`).send({});
    expect(res.status).toBe(404);
  });
});
