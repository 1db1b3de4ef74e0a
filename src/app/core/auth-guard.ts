import { Injector, inject } from '@angular/core';
import {
  ActivatedRouteSnapshot,
  CanActivateFn,
  Router,
  RouterStateSnapshot,
  UrlTree,
} from '@angular/router';

import { AuthSession } from './auth-session';
import { ROLE_HOME, Role } from './user';

const AREA_OWNERS: Readonly<Record<Role, string>> = {
  teacher: 'teachers',
  student: 'students',
  admin: 'admins',
};

/** The sign-in page, remembering where the person was going. */
export function signInTree(router: Router, returnUrl: string): UrlTree {
  const keep = returnUrl && returnUrl !== '/' && !returnUrl.startsWith('/sign-in');
  return router.createUrlTree(['/sign-in'], keep ? { queryParams: { returnUrl } } : {});
}

/** Lets signed-in people through; everyone else goes to sign-in with a returnUrl. */
export const requireSignedIn: CanActivateFn = async (_route, state) => {
  const router = inject(Router);
  const user = await inject(AuthSession).ensureLoaded();
  return user ? true : signInTree(router, state.url);
};

/**
 * Guard factory for an area that belongs to some roles. Others are sent to their own home with a
 * short explanation, rather than a blank page or a silent bounce.
 */
export function requireRole(...allowed: readonly Role[]): CanActivateFn {
  return async (_route: ActivatedRouteSnapshot, state: RouterStateSnapshot) => {
    const router = inject(Router);
    const injector = inject(Injector);
    const user = await inject(AuthSession).ensureLoaded();
    if (!user) return signInTree(router, state.url);
    if (allowed.includes(user.role)) return true;
    // The snack bar (and the overlay machinery under it) loads only when someone is turned away,
    // keeping it out of the first download.
    const { MatSnackBar } = await import('@angular/material/snack-bar');
    injector.get(MatSnackBar).open(areaMessage(allowed), 'OK', { duration: 5000 });
    return router.parseUrl(ROLE_HOME[user.role]);
  };
}

/** `/` → the signed-in person's home, else sign-in. */
export const redirectToHome: CanActivateFn = async () => {
  const router = inject(Router);
  const user = await inject(AuthSession).ensureLoaded();
  return router.parseUrl(user ? ROLE_HOME[user.role] : '/sign-in');
};

/** Keeps signed-in people off the sign-in page. */
export const redirectSignedIn: CanActivateFn = async () => {
  const router = inject(Router);
  const user = await inject(AuthSession).ensureLoaded();
  return user ? router.parseUrl(ROLE_HOME[user.role]) : true;
};

/** "That page is for teachers." / "That page is for teachers and admins." */
export function areaMessage(allowed: readonly Role[]): string {
  const owners = allowed.map((role) => AREA_OWNERS[role]);
  const list =
    owners.length <= 1
      ? (owners[0] ?? 'other people')
      : `${owners.slice(0, -1).join(', ')} and ${owners.at(-1)}`;
  return `That page is for ${list}.`;
}
