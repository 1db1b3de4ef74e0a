import type { Router } from 'express';
import { allowAnyone } from './auth/require-role';
import { HttpError } from './http-error';

/** What this reads of an Express 5 router's layers (the route audit test reads the same). */
interface RouteLayer {
  route?: { path: unknown; methods: Record<string, boolean | undefined> };
}

/**
 * Ends `router` with one catch-all route per path it serves, so that a method no route there
 * takes is answered 405 with an `Allow` header (and OPTIONS 204 with it), not a 404 that says
 * the path does not exist. Call it once every route of `router` is defined; the catch-all goes
 * last, so it only sees requests no route answered.
 */
export function answerWrongMethods(router: Router): Router {
  const methodsByPath = new Map<string, Set<string>>();
  for (const { route } of (router as unknown as { stack: RouteLayer[] }).stack) {
    if (!route || typeof route.path !== 'string' || route.methods['_all']) continue;
    const methods = methodsByPath.get(route.path) ?? new Set<string>();
    for (const [method, on] of Object.entries(route.methods)) {
      if (on) methods.add(method.toUpperCase());
    }
    methodsByPath.set(route.path, methods);
  }
  for (const [path, methods] of methodsByPath) {
    // Express answers HEAD with the GET route.
    if (methods.has('GET')) methods.add('HEAD');
    const allow = [...methods].sort().join(', ');
    router.all(path, allowAnyone, (req, res, next) => {
      res.setHeader('Allow', allow);
      if (req.method === 'OPTIONS') {
        res.status(204).end();
        return;
      }
      const where = req.originalUrl.split('?')[0];
      next(
        new HttpError(
          405,
          'method_not_allowed',
          `${where} does not take ${req.method}; it takes ${allow}.`,
        ),
      );
    });
  }
  return router;
}
