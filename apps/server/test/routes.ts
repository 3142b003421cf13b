import type { Express } from 'express';

export interface RegisteredRoute {
  method: string;
  path: string;
}

interface LayerLike {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: LayerLike[] };
  name?: string;
}

/**
 * Every route registered on the API router, as METHOD + path template ("/api/jobs/:id"). Sub-routers are
 * mounted without a path of their own, so their routes sit directly under /api.
 */
export function apiRoutes(app: Express): RegisteredRoute[] {
  const out: RegisteredRoute[] = [];
  const walk = (stack: LayerLike[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const [m, on] of Object.entries(layer.route.methods))
          if (on && m !== '_all') out.push({ method: m.toUpperCase(), path: prefix + layer.route.path });
      } else if (layer.handle?.stack) walk(layer.handle.stack, prefix);
    }
  };
  const root = (app as unknown as { router: { stack: LayerLike[] } }).router.stack;
  for (const layer of root) {
    // The API router is the one mounted at /api; the SPA fallback lives outside it.
    if (layer.handle?.stack) walk(layer.handle.stack, '/api');
  }
  return out;
}
