type Layer = {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
  rawPath?: string | string[];
};

/** Every METHOD /path the app registers, walked from the app's router through mounted routers. */
function walk(stack: Layer[], prefix = ''): string[] {
  return stack.flatMap((layer) => {
    if (layer.route) {
      const path = prefix + (layer.route.path === '/' && prefix ? '' : layer.route.path);
      return Object.keys(layer.route.methods)
        .filter((m) => m !== '_all')
        .map((m) => `${m.toUpperCase()} ${path}`);
    }
    if (layer.handle?.stack) {
      if (typeof layer.rawPath !== 'string')
        throw new Error(
          `a router is mounted on a non-string path (${String(layer.rawPath)}); the matrix cannot name its routes`,
        );
      return walk(layer.handle.stack, prefix + (layer.rawPath === '/' ? '' : layer.rawPath));
    }
    return [];
  });
}

/** The app's registered /api routes as 'METHOD /api/path/:param' (express app from createApp()). */
export const registeredApiRoutes = (app: unknown) =>
  walk((app as { router: { stack: Layer[] } }).router.stack).filter((r) => r.split(' ')[1].startsWith('/api/'));

/** Every registered route under the given prefixes (the API and, outside it, the IIIF and media routes). */
export const registeredRoutes = (app: unknown, prefixes: readonly string[]) =>
  walk((app as { router: { stack: Layer[] } }).router.stack).filter((r) =>
    prefixes.some((p) => r.split(' ')[1].startsWith(p)),
  );
