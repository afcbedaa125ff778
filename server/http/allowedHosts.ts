/**
 * Which `Host` names the server answers to, and the middleware that refuses the others.
 *
 * Why: DNS rebinding. A page on `attacker.example` can make its own name resolve to 127.0.0.1
 * and then talk to a Rungwright on the visitor's machine as a same-origin page would; the only
 * trace is the `Host: attacker.example` header. So every request whose Host is not one of our
 * names is refused before any route, file or database runs.
 *
 * Allowed: the loopback names (`localhost`, `127.0.0.1`, `[::1]`; a remote page cannot put them in
 * Host, so they are never a rebinding risk), `HOST` when it names one address or machine (not the
 * wildcard 0.0.0.0 / ::), `PUBLIC_URL`'s host (mailed links point there) and every name in
 * `ALLOWED_HOSTS`. Any port: the port says nothing about who the name belongs to.
 *
 * Status 421 Misdirected Request (RFC 9110 section 15.5.20: the server is "not configured to
 * produce responses for the combination of scheme and authority" in the request), not 400 (the
 * request is well formed) nor 403 (it is not about who asks).
 */
import type { RequestHandler } from 'express';
import type { Config } from '../config';
import { sendFailure } from './errorHandler';

/** Always allowed: a remote page cannot make a browser send them as Host. */
export const LOOPBACK_NAMES: readonly string[] = ['localhost', '127.0.0.1', '::1'];
const WILDCARD_ADDRESSES = new Set(['0.0.0.0', '::', '[::]']);

/** A Host header's parts: lower-case name (IPv6 without brackets, no trailing dot) and port. */
export interface HostParts {
  hostname: string;
  port: string | null;
}

// A name or IPv4 address, or a bracketed IPv6 address, then an optional port; nothing else (no
// user info, path or spaces), so a crafted header cannot make two parsers disagree.
const HOST_HEADER = /^(?:\[([0-9a-f:.]+)\]|([a-z0-9_.-]+))(?::(\d{1,5}))?$/i;

/** Parses a Host header (or the host part of a URL); null when it is missing or malformed. */
export function parseHostHeader(value: string | undefined): HostParts | null {
  if (!value) return null;
  const match = HOST_HEADER.exec(value.trim());
  if (!match) return null;
  const hostname = (match[1] ?? match[2] ?? '').toLowerCase().replace(/\.$/, '');
  if (hostname === '') return null;
  return { hostname, port: match[3] ?? null };
}

/** One entry of ALLOWED_HOSTS, HOST or a URL → a bare lower-case name; null when it is not a name. */
function nameOf(entry: string): string | null {
  const text = entry.trim();
  if (text === '') return null;
  if (text.includes('://')) {
    try {
      return nameOf(new URL(text).host);
    } catch {
      return null;
    }
  }
  // A bare IPv6 address (HOST=::1) has colons but no brackets.
  if (!text.startsWith('[') && (text.match(/:/g) ?? []).length > 1) return text.toLowerCase();
  return parseHostHeader(text)?.hostname ?? null;
}

/** The set of names this configuration answers to. */
export function allowedHostNames(config: Pick<Config, 'HOST' | 'PUBLIC_URL' | 'ALLOWED_HOSTS'>): Set<string> {
  const names = new Set<string>(LOOPBACK_NAMES);
  const add = (entry: string | undefined) => {
    const name = entry === undefined ? null : nameOf(entry);
    if (name && !WILDCARD_ADDRESSES.has(name)) names.add(name);
  };
  add(config.HOST);
  add(config.PUBLIC_URL);
  for (const entry of (config.ALLOWED_HOSTS ?? '').split(',')) add(entry);
  return names;
}

/** Refuses, with 421, any request whose Host is not an allowed name. */
export function refuseUnknownHosts(config: Config): RequestHandler {
  const allowed = allowedHostNames(config);
  return (req, res, next) => {
    const host = parseHostHeader(req.headers.host);
    if (host && allowed.has(host.hostname)) {
      next();
      return;
    }
    res.setHeader('Cache-Control', 'no-store');
    const shown = JSON.stringify((req.headers.host ?? '').slice(0, 100));
    sendFailure(res, {
      code: 'unknown_host',
      message: req.headers.host
        ? `This server does not answer to the host name ${shown}; its administrator can add the name to ALLOWED_HOSTS.`
        : 'The request has no Host header; this server answers only to the names it is configured for.',
    });
  };
}
