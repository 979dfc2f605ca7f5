import type { Routes } from '@angular/router';

/**
 * The buyer's import screens (guarded by the `imports` navigation entry in app.routes.ts): a
 * new import, the history of uploads, and one batch opened from the history.
 */
export const importsRoutes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Import · Keelson',
    loadComponent: () => import('./import-page').then((m) => m.ImportPage),
  },
  {
    path: 'history',
    title: 'Import history · Keelson',
    loadComponent: () => import('./import-history-page').then((m) => m.ImportHistoryPage),
  },
  {
    path: ':batchId',
    title: 'Import · Keelson',
    loadComponent: () => import('./import-page').then((m) => m.ImportPage),
  },
];
