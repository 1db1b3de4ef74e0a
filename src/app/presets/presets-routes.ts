import { Routes } from '@angular/router';

/** Lazy routes under /presets (the admin's curation). */
export const PRESET_ROUTES: Routes = [
  {
    path: '',
    title: 'Presets',
    loadComponent: () => import('./curation/preset-curation').then((m) => m.PresetCuration),
  },
];
