/**
 * Lists the routes of an Express 5 app by walking its router stack (router 2.x layers),
 * following routers mounted with `use(path, router)`. Each route is "METHOD /path" with the
 * path as written in the code (`/api/sites/:siteId`).
 */
import type { Express } from 'express';

interface RouteLike {
  path: string | string[];
  methods: Record<string, boolean>;
}
interface LayerLike {
  rawPath?: string | RegExp | (string | RegExp)[];
  route?: RouteLike;
  handle: { stack?: LayerLike[] };
}

export interface WalkedRoute {
  method: string;
  path: string;
}

function join(prefix: string, path: string): string {
  if (path === '/' || path === '') return prefix || '/';
  return `${prefix.replace(/\/$/, '')}/${path.replace(/^\//, '')}`;
}

function mountPaths(layer: LayerLike): string[] {
  const raw = layer.rawPath;
  if (raw === undefined) return [''];
  const list = Array.isArray(raw) ? raw : [raw];
  return list.map((p) => {
    if (typeof p !== 'string') throw new Error(`A mount path given as a regular expression cannot be listed: ${String(p)}`);
    return p === '/' ? '' : p;
  });
}

/** Every route of this router stack, mounted under `prefix`. */
export function walkStack(stack: LayerLike[], prefix = ''): WalkedRoute[] {
  const routes: WalkedRoute[] = [];
  for (const layer of stack) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      for (const p of paths) {
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') routes.push({ method: 'ALL', path: join(prefix, p) });
          else routes.push({ method: method.toUpperCase(), path: join(prefix, p) });
        }
      }
    } else if (Array.isArray(layer.handle.stack)) {
      for (const mount of mountPaths(layer)) routes.push(...walkStack(layer.handle.stack, join(prefix, mount)));
    }
  }
  return routes;
}

/** Every route of the app, sorted, each once ("GET /api/sites"). */
export function listRoutes(app: Express): string[] {
  const router = (app as unknown as { router: { stack: LayerLike[] } }).router;
  const keys = walkStack(router.stack).map((r) => `${r.method} ${r.path}`);
  return [...new Set(keys)].sort();
}

/**
 * What is wrong between the routes found in the router and a table keyed "METHOD /path":
 * a route with no entry (unless excluded, with a reason) and an entry with no route.
 */
export function tableProblems(routes: string[], table: Record<string, unknown>, excluded: Record<string, string> = {}): string[] {
  const found = new Set(routes);
  const problems: string[] = [];
  for (const route of routes) {
    if (!(route in table) && !(route in excluded)) problems.push(`${route}: in the router, but has no entry in the table`);
  }
  for (const key of [...Object.keys(table), ...Object.keys(excluded)]) {
    if (!found.has(key)) problems.push(`${key}: in the table, but no such route in the router`);
  }
  for (const key of Object.keys(table)) {
    if (key in excluded) problems.push(`${key}: both in the table and excluded`);
  }
  return problems;
}
