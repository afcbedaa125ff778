/**
 * Request logging. Each request gets an id (echoed as `x-request-id`). Logged when the answer has
 * gone (or the connection closed first): method, path without the query string, status, time. Never
 * headers, bodies or query strings, so no password, token or cookie reaches a log line.
 *
 * The line is the one pino-http wrote (`req: { id, method, path }`, `res: { statusCode }`,
 * `responseTime` in ms, message "request completed", "request aborted" or, from status 500 on,
 * "request errored" with `err`), without pino-http's per-request child logger: that built a copy
 * of the request's headers, query and socket address for every request, logged or not (3 % of a
 * save's CPU under load, measured by profile), and the request lines are written at `info`, which
 * a loaded server usually does not log.
 */
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pino, type Level, type Logger } from 'pino';
import type { RequestHandler } from 'express';

/** The server's logger; `level: 'silent'` in tests. */
export function createLogger(level: string): Logger {
  return pino({
    level,
    redact: { paths: ['*.password', '*.token', '*.cookie', '*.authorization', 'req.headers', 'res.headers'], remove: true },
  });
}

const REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

/** The caller's `x-request-id` when it is a plain token, else a new one; echoed on the answer. */
function requestId(req: IncomingMessage, res: ServerResponse): string {
  const given = req.headers['x-request-id'];
  const id = typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
  res.setHeader('x-request-id', id);
  return id;
}

/** Errors at 500 and above (and a failed response stream), a refused request (4xx) is a warning, the rest is information. */
function levelOf(statusCode: number): Level {
  return statusCode >= 500 ? 'error' : statusCode >= 400 ? 'warn' : 'info';
}

/** Logs one line per request, at `levelOf` its status. */
export function requestLogging(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const id = requestId(req, res);
    const started = Date.now();
    const done = (err?: unknown): void => {
      res.removeListener('finish', done);
      res.removeListener('close', done);
      res.removeListener('error', done);
      const level = err ? 'error' : levelOf(res.statusCode);
      if (!logger.isLevelEnabled(level)) return;
      const line = { req: { id, method: req.method, path: req.originalUrl.split('?')[0] }, res: { statusCode: res.statusCode } };
      const responseTime = Date.now() - started;
      if (err || res.statusCode >= 500) {
        logger[level]({ ...line, err: err ?? new Error(`failed with status code ${res.statusCode}`), responseTime }, 'request errored');
      } else {
        logger[level]({ ...line, responseTime }, !req.readableAborted && res.writableEnded ? 'request completed' : 'request aborted');
      }
    };
    res.on('finish', done);
    res.on('close', done);
    res.on('error', done);
    next();
  };
}
