/**
 * The one way the client talks to the server: JSON over `fetch`, every answer checked against the
 * shared zod schema of its route, every error turned into an `ApiFailure` with the code from the
 * shared error table. A 401 on a signed-in call is announced to `onUnauthenticated` so the app can
 * send the user to sign-in and back.
 */
import type { z } from 'zod';
import { API_ERROR_SUMMARY, ApiErrorBodySchema, type ApiErrorCode } from '@shared/api/errors';

/** A failed call, with the server's code and message (or a client-side one for network trouble). */
export class ApiFailure extends Error {
  constructor(
    readonly code: ApiErrorCode | 'network' | 'bad_response',
    message: string,
    readonly status: number,
    /** Field path → message, for forms. */
    readonly fields: Record<string, string> = {},
    readonly details: unknown = undefined,
  ) {
    super(message);
    this.name = 'ApiFailure';
  }
}

export interface HttpOptions {
  /** Defaults to the page's own origin (`''`). */
  baseUrl?: string;
  /** Called on any 401 except from the sign-in call itself. */
  onUnauthenticated?: () => void;
  fetchImpl?: typeof fetch;
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  /** A multipart upload instead of JSON. */
  form?: FormData;
  /** Do not report a 401 to `onUnauthenticated` (the sign-in form shows it itself). */
  quiet401?: boolean;
}

/** A typed HTTP client over one base URL. */
export interface Http {
  json<S extends z.ZodType>(path: string, schema: S, options?: RequestOptions): Promise<z.infer<S>>;
  /** For answers with no body (204) or that are not JSON. */
  raw(path: string, options?: RequestOptions): Promise<Response>;
}

async function failureFrom(response: Response): Promise<ApiFailure> {
  let body: unknown = null;
  try {
    body = await response.json();
  } catch {
    // not JSON: fall through to the generic message
  }
  const parsed = ApiErrorBodySchema.safeParse(body);
  if (parsed.success) {
    const { code, message, fields, details } = parsed.data.error;
    return new ApiFailure(code, message || API_ERROR_SUMMARY[code], response.status, fields ?? {}, details);
  }
  return new ApiFailure('bad_response', `The server answered ${response.status} ${response.statusText}.`, response.status);
}

export function createHttp(options: HttpOptions = {}): Http {
  const base = options.baseUrl ?? '';
  const doFetch = options.fetchImpl ?? ((input: RequestInfo | URL, init?: RequestInit) => fetch(input, init));

  async function raw(path: string, request: RequestOptions = {}): Promise<Response> {
    const headers: Record<string, string> = { Accept: 'application/json' };
    let body: BodyInit | undefined;
    if (request.form) body = request.form;
    else if (request.body !== undefined) {
      headers['Content-Type'] = 'application/json';
      body = JSON.stringify(request.body);
    }
    let response: Response;
    try {
      response = await doFetch(`${base}${path}`, { method: request.method ?? 'GET', headers, body, credentials: 'same-origin' });
    } catch {
      throw new ApiFailure('network', 'The server cannot be reached; check the connection and try again.', 0);
    }
    if (!response.ok) {
      const failure = await failureFrom(response);
      if (response.status === 401 && !request.quiet401) options.onUnauthenticated?.();
      throw failure;
    }
    return response;
  }

  async function json<S extends z.ZodType>(path: string, schema: S, request?: RequestOptions): Promise<z.infer<S>> {
    const response = await raw(path, request);
    let data: unknown;
    try {
      data = await response.json();
    } catch {
      throw new ApiFailure('bad_response', `The answer from ${path} is not JSON.`, response.status);
    }
    const parsed = schema.safeParse(data);
    if (!parsed.success) {
      const first = parsed.error.issues[0];
      throw new ApiFailure('bad_response', `The answer from ${path} is not as expected (${first?.path.join('.') ?? ''}: ${first?.message ?? ''}).`, response.status);
    }
    return parsed.data;
  }

  return { json, raw };
}

/** The message to show for any error thrown by a call. */
export function describeFailure(error: unknown): string {
  if (error instanceof ApiFailure) return error.message;
  return error instanceof Error ? error.message : String(error);
}
