import type { Express } from 'express';

interface Layer {
  rawPath?: string | string[];
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** "METHOD /path" for every route of the app with one of these methods, read from Express 5's router stack. */
export function routesOf(app: Express, methods: readonly string[]): string[] {
  const found: string[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      const paths = Array.isArray(layer.rawPath) ? layer.rawPath : [layer.rawPath ?? ''];
      for (const path of paths) {
        if (layer.route) {
          const full = `${prefix}${layer.route.path}`.replace(/(.)\/$/, '$1');
          for (const method of methods) if (layer.route.methods[method]) found.push(`${method.toUpperCase()} ${full}`);
        } else if (layer.handle?.stack) {
          walk(layer.handle.stack, `${prefix}${path === '/' ? '' : path}`);
        }
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return [...new Set(found)].sort();
}
