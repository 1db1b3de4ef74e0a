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
    loadComponent: () => {
      // The engraver is the page's largest piece and is needed as soon as the drill exists:
      // fetch it alongside the page instead of after the drill is generated (a failure here is
      // reported by the score, which imports it again).
      void import('../../../shared/notation/render-vexflow').catch(() => undefined);
      return import('./drill-page').then((m) => m.DrillPage);
    },
  },
];
