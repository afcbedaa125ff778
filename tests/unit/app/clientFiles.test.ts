import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import express from 'express';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { clientFiles } from '../../../server/http/clientFiles';

const dist = mkdtempSync(path.join(tmpdir(), 'rungwright-dist-'));
mkdirSync(path.join(dist, 'assets'));
writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Rungwright</title>');
writeFileSync(path.join(dist, 'assets', 'index-C38fXH4l.js'), 'export {};');
writeFileSync(path.join(dist, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
const app = express().use(clientFiles(dist));
afterAll(() => rmSync(dist, { recursive: true, force: true }));

describe('serving the built client', () => {
  it('lets browsers keep the hashed files under assets/ for a year without asking again', async () => {
    const res = await request(app).get('/assets/index-C38fXH4l.js').expect(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('keeps an unhashed file for an hour and has the page itself checked on every load', async () => {
    expect((await request(app).get('/favicon.svg').expect(200)).headers['cache-control']).toBe('public, max-age=3600');
    const page = await request(app).get('/programs/some-id').expect(200);
    expect(page.headers['cache-control']).toBe('no-cache');
    expect(page.text).toContain('<title>Rungwright</title>');
  });
});
