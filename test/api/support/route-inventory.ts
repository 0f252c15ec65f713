import type { Express } from 'express';

/** HTTP methods the API registers routes for. */
export type ApiMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

/** One registered API route, as Express would match it (`/api/cases/:id/visits`). */
export interface ApiRoute {
  method: ApiMethod;
  path: string;
}

const METHODS: readonly ApiMethod[] = ['GET', 'POST', 'PATCH', 'PUT', 'DELETE'];

/** True for the methods the inventory knows. */
export function isApiMethod(method: string): method is ApiMethod {
  return METHODS.some((known) => known === method);
}

/** What `router.listRoutes()` (the `router` package ≥ 2.3, Express 5's router) answers per registered path. */
interface ListedRoute {
  path: unknown;
  /** Upper-case methods of a route, `'*'` for `.all()`, an automatic `HEAD` after `GET`; undefined for a mounted router. */
  methods?: string[];
  /** The router mounted at `path` with `.use(path, router)`. */
  router?: unknown;
}

function listed(router: unknown, where: string): ListedRoute[] {
  // A router is a function object (router v2), the app's too.
  const listRoutes: unknown = (typeof router === 'function' || typeof router === 'object') && router !== null ? Reflect.get(router, 'listRoutes') : undefined;
  if (typeof listRoutes !== 'function') throw new Error(`${where} has no listRoutes(): the inventory needs the router package ≥ 2.3 (Express 5).`);
  const entries: unknown = listRoutes.call(router);
  if (!Array.isArray(entries)) throw new Error(`${where} listed its routes as something other than a list.`);
  return entries;
}

function joined(prefix: string, path: unknown): string {
  if (typeof path !== 'string') throw new Error(`A route under ${prefix || '/'} is registered with a non-string path; the inventory cannot name it.`);
  return `${prefix}${path === '/' ? '' : path}` || '/';
}

function collect(router: unknown, prefix: string, routes: ApiRoute[]): void {
  for (const entry of listed(router, `The router at ${prefix}`)) {
    const path = joined(prefix, entry.path);
    if (entry.router) {
      collect(entry.router, path, routes);
      continue;
    }
    const methods = entry.methods ?? [];
    for (const method of methods) {
      // The router answers HEAD for every GET by itself: not a route of its own.
      if (method === 'HEAD' && methods.includes('GET')) continue;
      // `*` (router.all) or an unusual verb: refused, so such a route gets looked at on purpose.
      if (!isApiMethod(method)) throw new Error(`Route ${path} answers ${method}, which the inventory does not know.`);
      routes.push({ method, path });
    }
  }
}

/**
 * Every route registered under `/api` in the real Express app, read from the router itself
 * (`router.listRoutes()`, recursing into mounted routers; nothing is listed by hand), sorted by
 * path then method. Paths keep their parameters as registered (`/api/audits/:id/results`); a
 * path with routers mounted twice (`/audits`) contributes the routes of both.
 *
 * @param built the built app (`createApp()` / `createTestApp()` result)
 * @throws {Error} when the router cannot list its routes, so an empty inventory never passes silently
 */
export function listApiRoutes(built: { app: Express }): Array<{ method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'; path: string }> {
  const routes: ApiRoute[] = [];
  // Express 5 exposes its router as `app.router` (not in @types/express).
  for (const entry of listed(Reflect.get(built.app, 'router'), 'The app router')) {
    if (entry.path === '/api' && entry.router) collect(entry.router, '/api', routes);
  }
  if (routes.length === 0) throw new Error('No /api routes found: the app mounts its API elsewhere or the router changed.');
  const unique = new Map(routes.map((route) => [routeKey(route), route]));
  return [...unique.values()].sort((a, b) => a.path.localeCompare(b.path) || a.method.localeCompare(b.method));
}

/** The table key of a route: `"METHOD /api/path/:param"`. */
export function routeKey(route: ApiRoute): string {
  return `${route.method} ${route.path}`;
}

/** The route a table key names. @throws {Error} for a key that is not `"METHOD /path"` with a known method */
export function parseRouteKey(key: string): ApiRoute {
  const [method, path, ...rest] = key.split(' ');
  if (!isApiMethod(method) || !path?.startsWith('/') || rest.length) throw new Error(`Not a route key: "${key}"`);
  return { method, path };
}
