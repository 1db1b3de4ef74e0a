import { Routes } from '@angular/router';

/** Lazy routes under /rule-cards. */
export const RULE_CARD_ROUTES: Routes = [
  {
    path: '',
    title: 'Rule cards',
    loadComponent: () => import('./rule-cards').then((m) => m.RuleCards),
  },
];
