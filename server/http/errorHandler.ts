/**
 * The one error middleware: every error becomes `{ error: { code, message, fields? } }` with the
 * status from the shared code table. Never a stack trace, never an HTML page.
 */
import type { ErrorRequestHandler, Request, RequestHandler, Response } from 'express';
import { API_ERROR_STATUS, type ApiErrorBody, type ApiErrorCode } from '@shared/api/errors';
import { ApiError, type Failure } from './failure';
import { failureFromDatabase } from './databaseErrors';
import { parameterAt } from './routeList';

/** Writes a failure as the JSON error body. */
export function sendFailure(res: Response, f: Failure): void {
  const body: ApiErrorBody = { error: { code: f.code, message: f.message } };
  if (f.fields) body.error.fields = f.fields;
  if (f.details !== undefined) body.error.details = f.details;
  res.status(API_ERROR_STATUS[f.code]).json(body);
}

/** Unknown `/api/*` paths. */
export const apiNotFound: RequestHandler = (req, res) => {
  sendFailure(res, { code: 'not_found', message: `No API route ${req.method} ${req.baseUrl}${req.path}` });
};

/** Error types of body-parser and raw-body that say what was wrong with the body. */
const BODY_ERRORS: Record<string, [ApiErrorCode, string]> = {
  'entity.parse.failed': ['bad_json', 'The request body is not valid JSON'],
  'entity.too.large': ['payload_too_large', 'The request body is larger than 1 MB'],
  'encoding.unsupported': ['unsupported_media_type', 'The request body uses an unsupported Content-Encoding (send identity, gzip, deflate or br)'],
  'charset.unsupported': ['unsupported_media_type', 'The request body uses an unsupported charset'],
  'request.size.invalid': ['validation', 'The request body is not as long as its Content-Length says'],
  'request.aborted': ['validation', 'The request body ended before it was complete'],
};

/** Status of an error raised by an HTTP library (http-errors), when it is the client's. */
function clientStatusOf(err: unknown): number | null {
  const status = (err as { status?: unknown; statusCode?: unknown }).status ?? (err as { statusCode?: unknown }).statusCode;
  return typeof status === 'number' && status >= 400 && status < 500 ? status : null;
}

const CODE_OF_STATUS: Partial<Record<number, ApiErrorCode>> = { 404: 'not_found', 413: 'payload_too_large', 415: 'unsupported_media_type' };

/**
 * A `%`-escape in the URL that does not decode (`%E0%A4%A`, `%zz`). The router raises it while it
 * matches a path parameter; the failure names that parameter, found from the app's routes.
 */
function malformedEscape(req: Request): Failure {
  const path = req.originalUrl.split('?')[0] ?? '';
  const segments = path.split('/');
  const index = segments.findIndex((segment) => {
    try {
      decodeURIComponent(segment);
      return false;
    } catch {
      return true;
    }
  });
  if (index < 0) return { code: 'validation', message: 'The request holds a malformed %-escape (in its query or a header)' };
  const shown = segments[index]!.slice(0, 40);
  const parameter = parameterAt(req.app, path, index);
  if (!parameter) return { code: 'validation', message: `The path segment "${shown}" is not valid %-encoding`, fields: { path: 'malformed %-escape' } };
  return { code: 'validation', message: `The path parameter ${parameter} ("${shown}") is not valid %-encoding`, fields: { [parameter]: 'malformed %-escape' } };
}

/** The known errors of the libraries and the database, as failures; null for an unexpected one. */
function failureFromError(err: unknown, req: Request): Failure | null {
  if (err instanceof ApiError) return err.failure;
  if (err instanceof URIError) return malformedEscape(req);
  const e = err as { type?: string; code?: string; message?: string; field?: string };
  if (e.type && BODY_ERRORS[e.type]) {
    const [code, message] = BODY_ERRORS[e.type];
    return { code, message: code === 'bad_json' && e.message ? `${message}: ${e.message}` : message };
  }
  if (typeof e.code === 'string' && e.code.startsWith('Z_')) {
    // zlib, inflating a body declared gzip/deflate/br that is not.
    return { code: 'validation', message: `The request body is not valid ${req.get('content-encoding') ?? 'compressed'} data (${e.message ?? e.code})` };
  }
  if (e.code === 'LIMIT_FILE_SIZE') return { code: 'payload_too_large', message: 'The uploaded file is larger than 1 MB' };
  if (e.code?.startsWith('LIMIT_')) {
    return { code: 'validation', message: `Upload refused: ${e.message ?? e.code}`, fields: e.field ? { [e.field]: e.message ?? e.code } : undefined };
  }
  const status = clientStatusOf(err);
  if (status !== null) return { code: CODE_OF_STATUS[status] ?? 'validation', message: e.message ?? 'The request cannot be read' };
  return failureFromDatabase(err);
}

/** The error middleware; `log` receives unexpected errors (never sent to the client). */
export function errorHandler(log: (err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    const known = failureFromError(err, req);
    if (known) {
      sendFailure(res, known);
      return;
    }
    log(err);
    sendFailure(res, { code: 'internal', message: 'Something went wrong on the server; the error was logged.' });
  };
}
