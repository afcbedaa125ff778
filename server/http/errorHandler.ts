/**
 * The one error middleware: every error becomes `{ error: { code, message, fields? } }` with the
 * status from the shared code table. Never a stack trace, never an HTML page.
 */
import type { ErrorRequestHandler, RequestHandler, Response } from 'express';
import { API_ERROR_STATUS, type ApiErrorBody, type ApiErrorCode } from '@shared/api/errors';
import { ApiError, type Failure } from './failure';

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

/** Errors thrown by body-parser and multer carry a `type` or `code`; map the known ones. */
function failureFromError(err: unknown): Failure | null {
  if (err instanceof ApiError) return err.failure;
  const e = err as { type?: string; code?: string; status?: number; message?: string; field?: string };
  const byBodyParserType: Record<string, [ApiErrorCode, string]> = {
    'entity.parse.failed': ['bad_json', 'The request body is not valid JSON'],
    'entity.too.large': ['payload_too_large', 'The request body is larger than 1 MB'],
    'encoding.unsupported': ['unsupported_media_type', 'The request body uses an unsupported encoding'],
    'charset.unsupported': ['unsupported_media_type', 'The request body uses an unsupported charset'],
  };
  if (e.type && byBodyParserType[e.type]) {
    const [code, message] = byBodyParserType[e.type];
    return { code, message: code === 'bad_json' && e.message ? `${message}: ${e.message}` : message };
  }
  if (e.code === 'LIMIT_FILE_SIZE') return { code: 'payload_too_large', message: 'The uploaded file is larger than 1 MB' };
  if (e.code?.startsWith('LIMIT_')) {
    return { code: 'validation', message: `Upload refused: ${e.message ?? e.code}`, fields: e.field ? { [e.field]: e.message ?? e.code } : undefined };
  }
  return null;
}

/** The error middleware; `log` receives unexpected errors (never sent to the client). */
export function errorHandler(log: (err: unknown) => void): ErrorRequestHandler {
  return (err, _req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    const known = failureFromError(err);
    if (known) {
      sendFailure(res, known);
      return;
    }
    log(err);
    sendFailure(res, { code: 'internal', message: 'Something went wrong on the server; the error was logged.' });
  };
}
