import { Routes } from '@angular/router';

/** Lazy routes under /gallery (published presets, every signed-in role). */
export const GALLERY_ROUTES: Routes = [
  {
    path: '',
    title: 'Preset gallery',
    loadComponent: () => import('./gallery/preset-gallery').then((m) => m.PresetGallery),
  },
];
