/**
 * Request logging with pino-http. Each request gets an id (echoed as `x-request-id`). Logged:
 * method, path without the query string, status, time. Never headers, bodies or query strings, so
 * no password, token or cookie reaches a log line.
 */
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pino, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import type { RequestHandler } from 'express';

/** The server's logger; `level: 'silent'` in tests. */
export function createLogger(level: string): Logger {
  return pino({
    level,
    redact: { paths: ['*.password', '*.token', '*.cookie', '*.authorization', 'req.headers', 'res.headers'], remove: true },
  });
}

const REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

/** The pino-http middleware. */
export function requestLogging(logger: Logger): RequestHandler {
  return pinoHttp({
    logger,
    genReqId: (req: IncomingMessage, res: ServerResponse) => {
      const given = req.headers['x-request-id'];
      const id = typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
      res.setHeader('x-request-id', id);
      return id;
    },
    serializers: {
      req: (req: { id: string; method: string; url: string }) => ({ id: req.id, method: req.method, path: req.url.split('?')[0] }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
  }) as unknown as RequestHandler;
}
