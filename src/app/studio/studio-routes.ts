import { Routes } from '@angular/router';

/** Lazy routes under /studio. */
export const STUDIO_ROUTES: Routes = [
  {
    path: '',
    title: 'Studio',
    loadComponent: () => import('../ui/coming-soon').then((m) => m.ComingSoon),
    data: {
      heading: 'Studio',
      icon: 'groups',
      purpose:
        'The studio will show your students and what is assigned to them, with due dates and target tempos.',
    },
  },
];
