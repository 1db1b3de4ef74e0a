import type { RequestHandler } from 'express';
import { HttpError } from '../http-error';
import type { Role } from './roles';

const ROLE_NAMES: Record<Role, string> = {
  admin: 'admins',
  teacher: 'teachers',
  student: 'students',
};

/** Marks the middleware that states who may use a route; read by the route-audit test. */
export const ROUTE_ACCESS = Symbol('tensile.routeAccess');

/** Who a route admits: anyone, any signed-in account, or the listed roles. */
export type RouteAccess = 'anyone' | 'signed-in' | readonly Role[];

function markAccess(handler: RequestHandler, access: RouteAccess): RequestHandler {
  return Object.assign(handler, { [ROUTE_ACCESS]: access });
}

/** The access a middleware states, if it is one of the guards in this file. */
export function routeAccessOf(handler: unknown): RouteAccess | undefined {
  return (handler as { [ROUTE_ACCESS]?: RouteAccess } | null)?.[ROUTE_ACCESS];
}

/** 401 `unauthenticated` unless the request comes from a signed-in, active account. */
export const requireSignIn: RequestHandler = markAccess((req, _res, next) => {
  if (!req.user) {
    next(new HttpError(401, 'unauthenticated', 'Sign in to continue.'));
    return;
  }
  next();
}, 'signed-in');

/**
 * Lets through only signed-in accounts holding one of `roles`: 401 when signed out, 403
 * `forbidden` when signed in with another role.
 */
export function requireRole(...roles: [Role, ...Role[]]): RequestHandler {
  const allowed = new Set<Role>(roles);
  const who = roles.map((role) => ROLE_NAMES[role]).join(' and ');
  return markAccess((req, res, next) => {
    requireSignIn(req, res, (error?: unknown) => {
      if (error) return next(error);
      if (!allowed.has(req.user!.role)) {
        return next(new HttpError(403, 'forbidden', `Only ${who} can do this.`));
      }
      next();
    });
  }, roles);
}

/** Marks a route open to everyone, signed in or not, so each route states who may use it. */
export const allowAnyone: RequestHandler = markAccess((_req, _res, next) => next(), 'anyone');
