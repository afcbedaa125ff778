/**
 * The request log line: its fields, its level by status, the request id, and that no header, query
 * string or body reaches it. The format is the one pino-http wrote before the server had its own
 * middleware, so log readers see no change.
 */
import { Writable } from 'node:stream';
import express from 'express';
import request from 'supertest';
import { pino } from 'pino';
import { describe, expect, it } from 'vitest';
import { requestLogging } from '../../server/http/logging';

interface LogLine {
  level: number;
  msg: string;
  req: { id: string; method: string; path: string };
  res: { statusCode: number };
  responseTime: number;
  err?: { message: string };
  [key: string]: unknown;
}

/** An app whose routes answer the status in their path, logging to `lines`. */
function loggedApp(level = 'info'): { app: express.Express; lines: LogLine[] } {
  const lines: LogLine[] = [];
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      lines.push(JSON.parse(chunk.toString()) as LogLine);
      done();
    },
  });
  const app = express();
  app.use(requestLogging(pino({ level }, stream)));
  app.post('/status/:code', express.json(), (req, res) => {
    res.status(Number(req.params.code)).json({ ok: true });
  });
  return { app, lines };
}

/** The line is written on `finish`, which may come just after supertest has the answer. */
async function lineCount(lines: LogLine[], n: number): Promise<void> {
  for (let i = 0; i < 50 && lines.length < n; i += 1) await new Promise((r) => setTimeout(r, 10));
}

describe('request logging', () => {
  it('logs method, path without the query, status, time and the request id it sends back', async () => {
    const { app, lines } = loggedApp();
    const res = await request(app).post('/status/201?token=secret').set('cookie', 'rw_session=abc').send({ password: 'hunter2' });
    await lineCount(lines, 1);
    expect(res.status).toBe(201);
    expect(lines).toHaveLength(1);
    const line = lines[0]!;
    expect(line).toMatchObject({ level: 30, msg: 'request completed', req: { id: res.headers['x-request-id'], method: 'POST', path: '/status/201' }, res: { statusCode: 201 } });
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(typeof line.responseTime).toBe('number');
    expect(Object.keys(line.req).sort()).toEqual(['id', 'method', 'path']);
    expect(Object.keys(line.res)).toEqual(['statusCode']);
    expect(JSON.stringify(line)).not.toMatch(/secret|hunter2|rw_session/);
  });

  it('logs a 4xx as a warning and a 5xx as an error with its status', async () => {
    const { app, lines } = loggedApp();
    await request(app).post('/status/404').send({});
    await lineCount(lines, 1);
    await request(app).post('/status/503').send({});
    await lineCount(lines, 2);
    expect(lines.map((l) => [l.level, l.msg, l.res.statusCode])).toEqual([
      [40, 'request completed', 404],
      [50, 'request errored', 503],
    ]);
    expect(lines[1]!.err?.message).toBe('failed with status code 503');
  });

  it('keeps a well-formed x-request-id from the caller and replaces any other', async () => {
    const { app, lines } = loggedApp();
    const kept = await request(app).post('/status/200').set('x-request-id', 'trace-42.a_b').send({});
    const replaced = await request(app).post('/status/200').set('x-request-id', 'no spaces allowed').send({});
    await lineCount(lines, 2);
    expect(kept.headers['x-request-id']).toBe('trace-42.a_b');
    expect(replaced.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(lines.map((l) => l.req.id)).toEqual(['trace-42.a_b', replaced.headers['x-request-id']]);
  });

  it('writes nothing below the logger level, and still sends the request id', async () => {
    const { app, lines } = loggedApp('warn');
    const res = await request(app).post('/status/200').send({});
    await request(app).post('/status/409').send({});
    await lineCount(lines, 1);
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(lines.map((l) => l.res.statusCode)).toEqual([409]);
  });
});
