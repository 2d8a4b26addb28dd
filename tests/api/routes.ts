import type { App } from '@/server/app';

/** One endpoint the app answers, e.g. `GET /api/jobs/:id`. */
export type ApiRoute = { method: string; path: string; key: string };
/** A plain middleware (not a route, not a router) and where it is mounted. */
export type MountedMiddleware = { path: string; name: string };

/** The parts of an Express 5 router layer the walk reads. */
type Layer = {
  name: string;
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean | undefined> };
  handle: { stack?: Layer[] };
};

function join(prefix: string, part: unknown, where: string): string {
  if (typeof part !== 'string') {
    throw new Error(
      `${where} under "${prefix || '/'}" is mounted on a ${Array.isArray(part) ? 'list' : typeof part} path; the route table reads string paths only`,
    );
  }
  const joined = (prefix + (part === '/' ? '' : part)).replace(/\/+$/, '');
  return joined || '/';
}

/**
 * Every route and plain middleware of the app, read from its own router stack
 * (nested routers included), so nothing the app answers is missed.
 */
export function routeTable(app: App): { routes: ApiRoute[]; middleware: MountedMiddleware[] } {
  const routes: ApiRoute[] = [];
  const middleware: MountedMiddleware[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const path = join(prefix, layer.route.path, 'A route');
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (!on) continue;
          const upper = method === '_all' ? 'ALL' : method.toUpperCase();
          routes.push({ method: upper, path, key: `${upper} ${path}` });
        }
      } else if (Array.isArray(layer.handle.stack)) {
        walk(layer.handle.stack, join(prefix, layer.rawPath, 'A router'));
      } else {
        middleware.push({ path: join(prefix, layer.rawPath, `Middleware ${layer.name}`), name: layer.name });
      }
    }
  };
  const router = (app as unknown as { router: { stack: Layer[] } }).router;
  walk(router.stack, '');
  return { routes, middleware };
}

/** True for paths under `/api` (the JSON API), false for the web export's paths. */
export const isApiPath = (path: string) => path === '/api' || path.startsWith('/api/');
