import type { RequestHandler } from 'express';
import { HttpError } from './http-error';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses state-changing requests sent by a browser from another origin. The SameSite=Lax
 * cookie already keeps other sites' requests signed out; this also covers other origins on the
 * same site (sibling subdomains), which SameSite does not. Requests without an `Origin`
 * header (non-browser clients) pass: they carry no ambient browser cookie.
 */
export function requireSameOrigin(publicUrl: string): RequestHandler {
  const publicOrigin = new URL(publicUrl).origin;
  return (req, _res, next) => {
    const origin = req.get('origin');
    if (SAFE_METHODS.has(req.method) || origin === undefined) return next();
    const ownOrigin = `${req.protocol}://${req.get('host') ?? ''}`;
    if (origin === ownOrigin || origin === publicOrigin) return next();
    next(
      new HttpError(403, 'cross_origin', 'This request came from another site and was refused.'),
    );
  };
}
