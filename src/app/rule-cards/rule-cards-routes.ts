import { Routes } from '@angular/router';
import { leaveSafely } from '../rule-card-editor/leave-guard';

/** Lazy routes under /rule-cards: the teacher's cards, a new card, one card in the editor. */
export const RULE_CARD_ROUTES: Routes = [
  {
    path: '',
    title: 'Rule cards',
    loadComponent: () => import('./rule-cards').then((m) => m.RuleCards),
  },
  {
    path: 'new',
    title: 'New rule card',
    canDeactivate: [leaveSafely],
    loadComponent: () =>
      import('../rule-card-editor/rule-card-editor').then((m) => m.RuleCardEditor),
  },
  {
    path: ':id',
    title: 'Rule card editor',
    canDeactivate: [leaveSafely],
    loadComponent: () =>
      import('../rule-card-editor/rule-card-editor').then((m) => m.RuleCardEditor),
  },
];
