import { Routes } from '@angular/router';

/** Lazy routes under /practice. */
export const PRACTICE_ROUTES: Routes = [
  {
    path: '',
    title: 'Practice',
    loadComponent: () => import('../ui/coming-soon').then((m) => m.ComingSoon),
    data: {
      heading: 'Practice',
      icon: 'timer',
      purpose:
        'Your practice log will record each session: minutes played, your clean tempo, a self-rating and a note for your teacher.',
    },
  },
];
