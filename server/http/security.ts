/**
 * Security headers and the CSRF defence.
 *
 * CSRF: the session cookie is SameSite=Lax, and every state-changing request (POST, PUT, PATCH,
 * DELETE) must carry an `Origin` header — or, when a browser leaves it out, a `Referer` — whose
 * host equals the request's `Host`. A request with neither is refused too, so a missing header can
 * never be the way round the check. Non-browser clients (CLI, benchmarks) send `Origin` themselves.
 */
import helmet from 'helmet';
import type { RequestHandler } from 'express';
import { ApiError } from './failure';

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

function hostOf(url: string | undefined): string | null {
  if (!url) return null;
  try {
    return new URL(url).host;
  } catch {
    return null;
  }
}

/** Refuses a state-changing request whose Origin (or Referer) is not this site. */
export const requireSameOrigin: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) {
    next();
    return;
  }
  const claimed = req.get('origin') ?? req.get('referer');
  const host = req.get('host');
  if (!claimed) {
    next(new ApiError({ code: 'bad_origin', message: `${req.method} requests must carry an Origin or Referer header from this site` }));
    return;
  }
  if (hostOf(claimed) !== host) {
    next(new ApiError({ code: 'bad_origin', message: `Cross-site request refused: origin ${hostOf(claimed) ?? claimed} is not ${host}` }));
    return;
  }
  next();
};
