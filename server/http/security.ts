/**
 * Security headers, the CSRF defence and the no-store rule for API answers.
 *
 * CSRF: the session cookie is SameSite=Lax, and every state-changing request (POST, PUT, PATCH,
 * DELETE) must carry an `Origin` header — or, when a browser leaves it out, a `Referer` — whose
 * host equals the request's `Host`. A request with neither is refused too, so a missing header can
 * never be the way round the check. Non-browser clients (CLI, benchmarks) send `Origin` themselves.
 * Host and Origin are compared by the same parser that decides which Host names are allowed
 * (`allowedHosts.ts`), so "same site" means one thing everywhere.
 */
import helmet from 'helmet';
import type { RequestHandler } from 'express';
import { ApiError } from './failure';
import { parseHostHeader, type HostParts } from './allowedHosts';

/** helmet with a CSP that allows only the app's own files (naive-ui injects style tags). */
export function securityHeaders(): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'", "'wasm-unsafe-eval'"], // the scan engine compiles its WebAssembly; 'unsafe-eval' stays out
        styleSrc: ["'self'", "'unsafe-inline'"],
        fontSrc: ["'self'"],
        imgSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
      },
    },
    // Not helmet's `no-referrer`: under it a browser sends `Origin: null` even on same-origin POSTs
    // (Fetch standard, "append a request Origin header"), which the check below would refuse.
    referrerPolicy: { policy: 'same-origin' },
  });
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The host of an Origin or Referer URL, parsed like a Host header. */
function hostOf(url: string): HostParts | null {
  try {
    return parseHostHeader(new URL(url).host);
  } catch {
    return null;
  }
}

const describeHost = (h: HostParts): string => `${h.hostname.includes(':') ? `[${h.hostname}]` : h.hostname}${h.port ? `:${h.port}` : ''}`;

/** Refuses a state-changing request whose Origin (or Referer) is not this site. */
export const requireSameOrigin: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) {
    next();
    return;
  }
  const claimed = req.get('origin') ?? req.get('referer');
  const host = parseHostHeader(req.headers.host);
  if (!claimed) {
    next(new ApiError({ code: 'bad_origin', message: `${req.method} requests must carry an Origin or Referer header from this site` }));
    return;
  }
  const from = hostOf(claimed);
  if (!from || !host || from.hostname !== host.hostname || from.port !== host.port) {
    const shown = from ? describeHost(from) : JSON.stringify(claimed.slice(0, 100));
    next(new ApiError({ code: 'bad_origin', message: `Cross-site request refused: origin ${shown} is not ${host ? describeHost(host) : 'this site'}` }));
    return;
  }
  next();
};

/**
 * `Cache-Control: no-store` on every API answer. Almost all of them depend on who asks (a shared
 * cache or the browser's back button must not hand one person's programs or grades to the next user
 * of a classroom PC), and `/api/health` must always report the present state; the few that do not
 * vary are small, so one rule with no exception to forget is worth more than caching them. The
 * built client's files keep their own caching (`clientFiles.ts`).
 */
export const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  next();
};
