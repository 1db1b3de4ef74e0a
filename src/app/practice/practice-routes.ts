import { Routes } from '@angular/router';

/** Lazy routes under /practice. */
export const PRACTICE_ROUTES: Routes = [
  {
    path: '',
    title: 'Practice',
    loadComponent: () => import('./practice-page').then((m) => m.PracticePage),
  },
];
