import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { routeAccessOf, type RouteAccess } from './require-role';

/** Express 5 (router 2) layer internals, as far as this audit reads them. */
interface Layer {
  rawPath?: unknown;
  handle: { stack?: Layer[] };
  route?: { path: string; methods: Record<string, boolean>; stack: { handle: unknown }[] };
}

interface FoundRoute {
  path: string;
  methods: string[];
  access: RouteAccess | undefined;
}

function collectRoutes(layers: Layer[], prefix: string, found: FoundRoute[]): FoundRoute[] {
  for (const layer of layers) {
    const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
    if (layer.route) {
      found.push({
        path: prefix + mount,
        methods: Object.keys(layer.route.methods),
        access: routeAccessOf(layer.route.stack[0]?.handle),
      });
    } else if (layer.handle.stack) {
      collectRoutes(layer.handle.stack, prefix + mount, found);
    }
  }
  return found;
}

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ seed: false });
});
afterAll(async () => {
  await t.close();
});

describe('every API route states who may use it', () => {
  it('starts each /api route with allowAnyone, requireSignIn or requireRole', () => {
    const router = (t.app as Express & { router: { stack: Layer[] } }).router;
    const apiRoutes = collectRoutes(router.stack, '', []).filter((r) => r.path.startsWith('/api'));
    // The audit must actually see the routes (guards against Express internals changing).
    expect(apiRoutes.map((r) => r.path)).toEqual(
      expect.arrayContaining([
        '/api/health',
        '/api/auth/sign-in',
        '/api/users',
        '/api/students',
        '/api/presets/:id',
        '/api/rule-cards/:id',
        '/api/drills/:id/share',
        '/api/seed-links/:code',
      ]),
    );
    const unguarded = apiRoutes.filter((r) => r.access === undefined);
    expect(unguarded).toEqual([]);
  });

  it('opens shared drills to anyone and keeps authoring to teachers and admins', () => {
    const router = (t.app as Express & { router: { stack: Layer[] } }).router;
    const routes = collectRoutes(router.stack, '', []);
    const access = (path: string) => routes.find((r) => r.path === path)?.access;
    expect(access('/api/seed-links/:code')).toBe('anyone');
    expect(access('/api/rule-cards/:id')).toEqual(['teacher', 'admin']);
    expect(access('/api/drills/:id')).toEqual(['teacher', 'admin']);
    expect(access('/api/presets/promote')).toEqual(['admin']);
  });

  it('keeps the student list to teachers and admins', () => {
    const router = (t.app as Express & { router: { stack: Layer[] } }).router;
    const students = collectRoutes(router.stack, '', []).find((r) => r.path === '/api/students');
    expect(students?.access).toEqual(['teacher', 'admin']);
  });
});
