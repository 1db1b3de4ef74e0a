import { Routes } from '@angular/router';
import { leaveSafely } from '../rule-card-editor/leave-guard';

/** Lazy routes under /worksheets: the list, a new worksheet, one worksheet, its print preview. */
export const WORKSHEET_ROUTES: Routes = [
  {
    path: '',
    title: 'Worksheets',
    loadComponent: () => import('./worksheets').then((m) => m.Worksheets),
  },
  {
    path: 'new',
    title: 'New worksheet',
    canDeactivate: [leaveSafely],
    loadComponent: () => import('./worksheet-editor').then((m) => m.WorksheetEditor),
  },
  {
    path: ':id',
    title: 'Worksheet',
    canDeactivate: [leaveSafely],
    loadComponent: () => import('./worksheet-editor').then((m) => m.WorksheetEditor),
  },
];
