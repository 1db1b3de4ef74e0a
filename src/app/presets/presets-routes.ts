import { Routes } from '@angular/router';

/** Lazy routes under /presets. */
export const PRESET_ROUTES: Routes = [
  { path: '', title: 'Presets', loadComponent: () => import('./presets').then((m) => m.Presets) },
];
