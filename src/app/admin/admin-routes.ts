import { Routes } from '@angular/router';

/** Lazy routes under /admin. */
export const ADMIN_ROUTES: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'users' },
  {
    path: 'users',
    title: 'Users',
    loadComponent: () => import('./users/users').then((m) => m.Users),
  },
  {
    path: 'outbox',
    title: 'Outbox',
    loadComponent: () => import('./outbox/outbox').then((m) => m.Outbox),
  },
];
