/**
 * Every route of an Express app as `METHOD /path/:param`, read from its router stack (Express 5,
 * router 2). The error middleware uses it to name the path parameter a malformed `%`-escape sits
 * in; the fuzz test uses it to reach every route.
 */
import type { Application } from 'express';

export interface RouteEntry {
  /** Upper case, e.g. `GET`. */
  method: string;
  /** The full pattern, e.g. `/api/programs/:id/versions/:number`. */
  path: string;
}

interface LayerLike {
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: LayerLike[] };
}

function collect(stack: readonly LayerLike[], prefix: string, into: RouteEntry[]): void {
  for (const layer of stack) {
    if (layer.route && typeof layer.route.path === 'string') {
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== '_all') into.push({ method: method.toUpperCase(), path: `${prefix}${layer.route.path}` });
      }
    } else if (layer.handle?.stack && typeof layer.rawPath === 'string') {
      collect(layer.handle.stack, layer.rawPath === '/' ? prefix : `${prefix}${layer.rawPath}`, into);
    }
  }
}

const cache = new WeakMap<object, RouteEntry[]>();

/** The app's routes in the order they are matched (read once per app). */
export function listRoutes(app: Application): RouteEntry[] {
  const cached = cache.get(app);
  if (cached) return cached;
  const routes: RouteEntry[] = [];
  const router = (app as unknown as { router?: { stack: LayerLike[] } }).router;
  if (router) collect(router.stack, '', routes);
  cache.set(app, routes);
  return routes;
}

/**
 * The name of the parameter of `app`'s routes that path segment `index` of `path` fills (`id` for
 * segment 3 of `/api/programs/%E0`), or null when no route has a parameter there.
 */
export function parameterAt(app: Application, path: string, index: number): string | null {
  const segments = path.split('/');
  for (const route of listRoutes(app)) {
    const pattern = route.path.split('/');
    if (pattern.length !== segments.length) continue;
    const name = pattern[index];
    if (!name?.startsWith(':')) continue;
    const fits = pattern.every((part, i) => i === index || part.startsWith(':') || part === segments[i]);
    if (fits) return name.slice(1);
  }
  return null;
}
