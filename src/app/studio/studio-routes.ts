import { Routes } from '@angular/router';

/** Lazy routes under /studio. */
export const STUDIO_ROUTES: Routes = [
  {
    path: '',
    title: 'Studio',
    loadComponent: () => import('./studio-page').then((m) => m.StudioPage),
  },
  {
    path: 'students/:id',
    title: 'Student',
    loadComponent: () => import('./student-progress').then((m) => m.StudentProgress),
  },
  {
    path: 'assignments/:id',
    title: 'Assignment',
    loadComponent: () => import('./assignment-detail').then((m) => m.AssignmentDetail),
  },
];
