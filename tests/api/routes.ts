/**
 * The API's routes as the Express 5 router holds them, for tests that must cover every route
 * (tests/api/security-matrix.test.ts). Express 5 (router 2.x) keeps `app.router.stack`: a layer
 * with `route` is a route (its `path` and `methods`); a layer whose `handle` has a `stack` is a
 * mounted router, and its mount path is the layer's `rawPath` (router 2.x has no `path` on a
 * layer until it matched a request).
 */
import type { Express } from 'express';

export interface RouteInfo {
  method: string;
  /** full path with its parameters, e.g. `/api/panels/:id/circuits` */
  path: string;
}

interface RouterLayer {
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle: { stack?: RouterLayer[] };
}

function walk(stack: readonly RouterLayer[], prefix: string, out: Map<string, RouteInfo>): void {
  for (const layer of stack) {
    if (layer.route) {
      if (typeof layer.route.path !== 'string') continue; // a pattern route (the web app's fallback)
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (!on || method === '_all') continue;
        const route = { method: method.toUpperCase(), path: `${prefix}${layer.route.path}` };
        out.set(`${route.method} ${route.path}`, route);
      }
    } else if (layer.handle.stack) {
      const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
      walk(layer.handle.stack, `${prefix}${mount}`, out);
    }
  }
}

/** Every method + path the app answers, once each, in the order they were registered. */
export function listRoutes(app: Express): RouteInfo[] {
  const out = new Map<string, RouteInfo>();
  walk(app.router.stack as unknown as RouterLayer[], '', out);
  return [...out.values()];
}
