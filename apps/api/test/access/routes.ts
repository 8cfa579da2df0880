import type { Express } from 'express';

interface Layer {
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
  rawPath?: unknown;
}

/**
 * Every route the app answers, as 'METHOD /full/path', read from Express's own router stack
 * (nested routers included), so nothing has to be listed by hand.
 */
export function listRoutes(app: Express, under = '/api'): string[] {
  const found: string[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const path = String(layer.route.path);
        const full = path === '/' ? prefix || '/' : `${prefix}${path}`;
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all') found.push(`${method.toUpperCase()} ${full}`);
        }
      } else if (layer.handle?.stack) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
        walk(layer.handle.stack, `${prefix}${mount}`);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return [...new Set(found.filter((r) => r.split(' ')[1]!.startsWith(under)))].sort();
}
