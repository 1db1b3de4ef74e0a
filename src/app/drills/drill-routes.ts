import { Routes } from '@angular/router';

/**
 * Lazy routes under /drills: `/drills` lists recent drills and opens new ones;
 * `/drills/:cardId?seed=SEED` opens one drill.
 */
export const DRILL_ROUTES: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Drills',
    loadComponent: () => import('./drills-index').then((m) => m.DrillsIndex),
  },
  {
    path: ':cardId',
    title: 'Drill',
    loadComponent: () => import('./drill-page').then((m) => m.DrillPage),
  },
];
