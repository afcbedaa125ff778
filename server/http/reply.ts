/** Route helpers: parse a request part with zod into an Outcome, and answer an Outcome. */
import type { RequestHandler, Response } from 'express';
import { z } from 'zod';
import { describeFields, failure, fieldsFromZod, success, type Outcome } from './failure';
import { sendFailure } from './errorHandler';

/** Parses `value` (a body, query or params) with `schema`; a failure names each bad field. */
export function parse<S extends z.ZodType>(schema: S, value: unknown): Outcome<z.infer<S>> {
  const parsed = schema.safeParse(value ?? {});
  if (parsed.success) return success(parsed.data);
  const fields = fieldsFromZod(parsed.error);
  return failure('validation', describeFields(fields), { fields });
}

const IdSchema = z.uuid();

/** Parses a route's `:id`-style parameter; anything that is not a uuid cannot exist (404). */
export function parseId(value: unknown, what: string): Outcome<string> {
  const parsed = IdSchema.safeParse(value);
  return parsed.success ? success(parsed.data) : failure('not_found', `This ${what} does not exist or is not open to you`);
}

/** Sends the value with `status` (204 sends no body), or the failure. */
export function reply<T>(res: Response, outcome: Outcome<T>, status = 200, body: (value: T) => unknown = (v) => v): void {
  if (!outcome.ok) sendFailure(res, outcome.failure);
  else if (status === 204) res.status(204).end();
  else res.status(status).json(body(outcome.value));
}

/**
 * Sends `{ [key]: { ...summary, document } }` with `status` (or the failure), the document being JSON
 * text already at hand (the text a save just stored): the bytes `res.json` would send for the same
 * object, without serialising a whole document again. `summary` holds plain JSON values.
 */
export function replyWithDocument(res: Response, outcome: Outcome<{ summary: object; documentJson: string }>, status: number, key: string): void {
  if (!outcome.ok) return sendFailure(res, outcome.failure);
  const summary = JSON.stringify(outcome.value.summary);
  const fields = summary === '{}' ? '{' : `${summary.slice(0, -1)},`;
  // As `res.json` does: the type unless one is set, then `send` (which adds the charset and length).
  if (!res.get('Content-Type')) res.set('Content-Type', 'application/json');
  res.status(status).send(`{${JSON.stringify(key)}:${fields}"document":${outcome.value.documentJson}}}`);
}

/** True when the request carries no body at all (no Transfer-Encoding, no or a zero Content-Length). */
function hasNoBody(req: Parameters<RequestHandler>[0]): boolean {
  const length = req.headers['content-length'];
  return req.headers['transfer-encoding'] === undefined && (length === undefined || length.trim() === '0');
}

/**
 * 415 for a state-changing request whose body is not JSON (uploads are mounted before this). A
 * request with no body at all has nothing to mistype: a browser's bodiless POST (sign-out) sends
 * `Content-Length: 0` and no Content-Type, and goes through as an empty body.
 */
export const requireJsonBody: RequestHandler = (req, res, next) => {
  if (req.method !== 'GET' && req.method !== 'HEAD' && !hasNoBody(req) && req.is('application/json') === false) {
    sendFailure(res, { code: 'unsupported_media_type', message: `Send JSON (Content-Type: application/json), not ${req.get('content-type') ?? 'an untyped body'}` });
    return;
  }
  next();
};

/**
 * Runs `task` after the answer has been sent, without the response waiting for it: work whose
 * duration would tell something (whether an e-mail address has an account) must not happen on the
 * response path. A failure is logged, never thrown.
 */
export function afterAnswer(log: { error: (obj: object, msg: string) => void }, what: string, task: () => Promise<unknown>): void {
  setImmediate(() => {
    task().catch((err: unknown) => log.error({ err }, `${what} failed after the answer was sent`));
  });
}
