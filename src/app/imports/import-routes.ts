import { Routes } from '@angular/router';

/** Lazy routes under /imports. */
export const IMPORT_ROUTES: Routes = [
  {
    path: '',
    title: 'Import groove',
    loadComponent: () => import('./import-page').then((m) => m.ImportPage),
  },
];
