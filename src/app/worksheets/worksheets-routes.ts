import { Routes } from '@angular/router';

/** Lazy routes under /worksheets. */
export const WORKSHEET_ROUTES: Routes = [
  {
    path: '',
    title: 'Worksheets',
    loadComponent: () => import('../ui/coming-soon').then((m) => m.ComingSoon),
    data: {
      heading: 'Worksheets',
      icon: 'description',
      purpose:
        'Worksheets will gather drills in order, each with a tempo ladder to tick off, ready to print or share.',
    },
  },
];
