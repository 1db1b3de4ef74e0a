import { Routes } from '@angular/router';

/** Lazy routes under /drills: `/drills/:cardId?seed=SEED` opens one drill. */
export const DRILL_ROUTES: Routes = [
  { path: '', pathMatch: 'full', redirectTo: '/' },
  {
    path: ':cardId',
    title: 'Drill',
    loadComponent: () => import('./drill-page').then((m) => m.DrillPage),
  },
];
