/**
 * Lists the routes an Express 5 app mounts (method + path pattern) by walking its router stack, so the
 * authorization table can prove it names every route.
 */
import type { Express } from 'express';

/** One mounted route, e.g. `{ method: 'PATCH', path: '/api/people/:id' }`. */
export interface MountedRoute {
  method: string;
  path: string;
}

interface StackLayer {
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: StackLayer[] };
}

/**
 * Every route under `prefix` (default `/api`) with its method, in mount order.
 * @param app - the app built by createApp
 * @param prefix - only routes whose path starts with this
 */
export function listRoutes(app: Express, prefix = '/api'): MountedRoute[] {
  const found: MountedRoute[] = [];
  const walk = (stack: StackLayer[], base: string): void => {
    for (const layer of stack) {
      const here = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
      if (layer.route && typeof layer.route.path === 'string') {
        const path = joinPath(base, layer.route.path);
        for (const [method, on] of Object.entries(layer.route.methods))
          if (on && method !== '_all') found.push({ method: method.toUpperCase(), path });
      } else if (layer.handle?.stack) walk(layer.handle.stack, joinPath(base, here));
    }
  };
  const router = (app as unknown as { router: { stack: StackLayer[] } }).router;
  walk(router.stack, '');
  return found.filter((route) => route.path.startsWith(prefix));
}

function joinPath(base: string, path: string): string {
  const joined = `${base}/${path}`.replace(/\/+/g, '/');
  return joined.length > 1 ? joined.replace(/\/$/, '') : joined;
}
