import { Routes } from '@angular/router';

import { redirectSignedIn, redirectToHome, requireRole, requireSignedIn } from './core/auth-guard';

/**
 * Every feature is a lazy chunk, so the first load carries only the router, the session and the
 * page being opened. Titles are page names; TensileTitleStrategy prefixes "Tensile · ".
 */
export const routes: Routes = [
  { path: '', pathMatch: 'full', canActivate: [redirectToHome], children: [] },
  {
    path: 'sign-in',
    title: 'Sign in',
    canActivate: [redirectSignedIn],
    loadComponent: () => import('./auth/sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'invitations/:token',
    title: 'Accept invitation',
    data: { kind: 'invitation' },
    loadComponent: () =>
      import('./auth/choose-password/choose-password').then((m) => m.ChoosePassword),
  },
  {
    path: 'reset-password/:token',
    title: 'Reset password',
    data: { kind: 'reset' },
    loadComponent: () =>
      import('./auth/choose-password/choose-password').then((m) => m.ChoosePassword),
  },
  {
    path: 'forgot-password',
    title: 'Forgot password',
    loadComponent: () =>
      import('./auth/forgot-password/forgot-password').then((m) => m.ForgotPassword),
  },
  {
    // A shared drill: open to anyone, signed in or not, outside the signed-in shell.
    path: 's/:code',
    title: 'Shared drill',
    loadComponent: () => import('./seed-link/seed-link-page').then((m) => m.SeedLinkPage),
  },
  {
    path: '',
    canActivate: [requireSignedIn],
    loadComponent: () => import('./shell/shell').then((m) => m.Shell),
    children: [
      {
        path: 'rule-cards',
        canActivate: [requireRole('teacher')],
        loadChildren: () =>
          import('./rule-cards/rule-cards-routes').then((m) => m.RULE_CARD_ROUTES),
      },
      {
        // Open to every signed-in role: students practise built-in cards read-only.
        path: 'drills',
        loadChildren: () => import('./drills/drill-routes').then((m) => m.DRILL_ROUTES),
      },
      {
        path: 'saved-drills',
        canActivate: [requireRole('teacher')],
        loadChildren: () =>
          import('./saved-drills/saved-drills-routes').then((m) => m.SAVED_DRILL_ROUTES),
      },
      {
        path: 'worksheets',
        canActivate: [requireRole('teacher')],
        loadChildren: () =>
          import('./worksheets/worksheets-routes').then((m) => m.WORKSHEET_ROUTES),
      },
      {
        path: 'imports',
        canActivate: [requireRole('teacher')],
        loadChildren: () => import('./imports/import-routes').then((m) => m.IMPORT_ROUTES),
      },
      {
        path: 'print-settings',
        title: 'Print settings',
        canActivate: [requireRole('teacher')],
        loadComponent: () => import('./branding/print-settings').then((m) => m.PrintSettings),
      },
      {
        path: 'studio',
        canActivate: [requireRole('teacher')],
        loadChildren: () => import('./studio/studio-routes').then((m) => m.STUDIO_ROUTES),
      },
      {
        path: 'assignments',
        canActivate: [requireRole('student')],
        loadChildren: () =>
          import('./assignments/assignments-routes').then((m) => m.ASSIGNMENT_ROUTES),
      },
      {
        path: 'practice',
        canActivate: [requireRole('student')],
        loadChildren: () => import('./practice/practice-routes').then((m) => m.PRACTICE_ROUTES),
      },
      {
        // Published presets: every signed-in role browses them.
        path: 'gallery',
        loadChildren: () => import('./presets/gallery-routes').then((m) => m.GALLERY_ROUTES),
      },
      {
        path: 'presets',
        canActivate: [requireRole('admin')],
        loadChildren: () => import('./presets/presets-routes').then((m) => m.PRESET_ROUTES),
      },
      {
        path: 'admin',
        canActivate: [requireRole('admin')],
        loadChildren: () => import('./admin/admin-routes').then((m) => m.ADMIN_ROUTES),
      },
    ],
  },
  {
    // Outside the shell so it answers signed-out visitors too.
    path: '**',
    title: 'Page not found',
    loadComponent: () => import('./not-found/not-found').then((m) => m.NotFound),
  },
];
