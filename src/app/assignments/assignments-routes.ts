import { Routes } from '@angular/router';

/** Lazy routes under /assignments. */
export const ASSIGNMENT_ROUTES: Routes = [
  {
    path: '',
    title: 'Assignments',
    loadComponent: () => import('./assignments').then((m) => m.Assignments),
  },
  {
    path: ':id',
    title: 'Assignment',
    loadComponent: () => import('./assignment-page').then((m) => m.AssignmentPage),
  },
];
