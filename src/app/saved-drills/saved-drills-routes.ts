import { Routes } from '@angular/router';

/** Lazy routes under /saved-drills. */
export const SAVED_DRILL_ROUTES: Routes = [
  { path: '', pathMatch: 'full', redirectTo: '/drills' },
  {
    path: ':id',
    title: 'Saved drill',
    loadComponent: () => import('./saved-drill-page').then((m) => m.SavedDrillPage),
  },
];
