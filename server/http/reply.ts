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

/** An answer `{ ...fields, [key]: { ...summary, document } }` whose document is JSON text already at hand. */
export interface DocumentAnswer {
  /** Plain JSON values sent before `key` (e.g. the program beside its head version). */
  fields?: object;
  key: string;
  /** Plain JSON values. */
  summary: object;
  /** `JSON.stringify` of the document: the text a save stored, or the row cache's. */
  documentJson: string;
}

/** `{` and the members of a JSON object's text, ready for more members (`{"a":1,`, or `{` for `{}`). */
const openObject = (json: string): string => (json === '{}' ? '{' : `${json.slice(0, -1)},`);

/**
 * Sends `answer(value)` with `status` (or the failure): the bytes `res.json` would send for the same
 * object, without serialising a whole document again (a 20-rung document is about 9 kB of JSON).
 */
export function replyWithDocument<T>(res: Response, outcome: Outcome<T>, status: number, answer: (value: T) => DocumentAnswer): void {
  if (!outcome.ok) return sendFailure(res, outcome.failure);
  const { fields = {}, key, summary, documentJson } = answer(outcome.value);
  // As `res.json` does: the type unless one is set, then `send` (which adds the charset and length).
  if (!res.get('Content-Type')) res.set('Content-Type', 'application/json');
  res.status(status).send(`${openObject(JSON.stringify(fields))}${JSON.stringify(key)}:${openObject(JSON.stringify(summary))}"document":${documentJson}}}`);
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
