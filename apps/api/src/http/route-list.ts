import type { Express } from 'express';

/** One route the app answers: its method and its path pattern as written (`/api/saws/:id`). */
export type RouteEntry = { method: string; path: string };

/** The parts of Express 5's router layers (router 2.x) that say which routes exist. */
type Layer = {
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
};

/**
 * Every route the app's router holds, walked from Express's own stack, in order: the list a table-driven test
 * (authorization over routes × roles, fuzzing every route's input) compares with its own table, so a route
 * added without a row in the table fails that test instead of going unchecked.
 */
export function listRoutes(app: Express): RouteEntry[] {
  const routes: RouteEntry[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all')
            routes.push({ method: method.toUpperCase(), path: prefix + String(layer.route.path) });
        }
      } else if (layer.handle?.stack) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
        walk(layer.handle.stack, prefix + mount);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return routes;
}
