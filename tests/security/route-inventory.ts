/**
 * The routes an Express application really serves, read from its router stacks (Express 5 / router 2:
 * each layer keeps its `rawPath`; a route layer has `route.path` and `route.methods`; a mounted router's
 * handle has its own `stack`; the v1 gateway's handle lists its operations as `routes`). Used to check the served routes against the OpenAPI document.
 */
import type { Express } from 'express';

interface LayerLike {
  rawPath?: string | RegExp | Array<string | RegExp>;
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: { stack?: LayerLike[]; routes?: ServedRoute[] };
}

export interface ServedRoute {
  method: string;
  /** In OpenAPI form: `:param` becomes `{param}`. */
  path: string;
}

const join = (prefix: string, path: string) => `${prefix}${path === '/' ? '' : path}`.replace(/\/+/g, '/') || '/';

export function servedRoutes(app: Express): ServedRoute[] {
  const out: ServedRoute[] = [];
  const walk = (stack: LayerLike[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const p of paths) {
          for (const [method, on] of Object.entries(layer.route.methods)) {
            if (on && method !== '_all') out.push({ method, path: join(prefix, p).replace(/:(\w+)/g, '{$1}') });
          }
        }
      } else if (layer.handle?.stack || layer.handle?.routes) {
        const raw = Array.isArray(layer.rawPath) ? layer.rawPath[0] : layer.rawPath;
        const at = typeof raw === 'string' && raw !== '/' ? join(prefix, raw) : prefix;
        if (layer.handle.stack) walk(layer.handle.stack, at);
        for (const r of layer.handle.routes ?? []) out.push({ method: r.method, path: join(at, r.path) });
      }
    }
  };
  const router = (app as unknown as { router: { stack: LayerLike[] } }).router;
  walk(router.stack, '');
  return out;
}
