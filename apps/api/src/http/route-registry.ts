import type { Express } from 'express';
import { ROUTE_ACCESS, type RouteAccess } from './route';

/** A route found on the app, with the access its guard declares (undefined: none declared). */
export interface RegisteredRoute {
  method: string;
  path: string;
  access: RouteAccess | undefined;
}

interface StackLayer {
  route?: { path: string; methods: Record<string, boolean>; stack: StackLayer[] };
  handle: ((...args: unknown[]) => unknown) & { stack?: StackLayer[] } & {
    [ROUTE_ACCESS]?: RouteAccess;
  };
  rawPath?: unknown;
}

/**
 * Walks the Express app's router stack (mounted routers included) and lists every route with
 * its method, full path and declared access. This is the route registry: the access lives on
 * the guard each route runs, so what is listed is what is enforced.
 */
export function listRoutes(app: Express): RegisteredRoute[] {
  const routes: RegisteredRoute[] = [];
  collect(app.router.stack as unknown as StackLayer[], '', routes);
  return routes;
}

function collect(stack: StackLayer[], prefix: string, routes: RegisteredRoute[]): void {
  for (const layer of stack) {
    if (layer.route) {
      const path = joinPath(prefix, layer.route.path);
      const guard = layer.route.stack.find((inner) => inner.handle[ROUTE_ACCESS] !== undefined);
      for (const method of Object.keys(layer.route.methods)) {
        routes.push({ method: method.toUpperCase(), path, access: guard?.handle[ROUTE_ACCESS] });
      }
    } else if (Array.isArray(layer.handle.stack)) {
      const mount = typeof layer.rawPath === 'string' ? layer.rawPath : '';
      collect(layer.handle.stack, joinPath(prefix, mount), routes);
    }
  }
}

function joinPath(prefix: string, path: string): string {
  const joined = `${prefix}/${path}`.replace(/\/{2,}/g, '/');
  return joined.length > 1 ? joined.replace(/\/$/, '') : joined;
}
