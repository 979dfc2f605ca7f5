import type { Routes } from '@angular/router';

/** The risk register (guarded by the `register` navigation entry in app.routes.ts). */
export const registerRoutes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Risk register · Keelson',
    loadComponent: () => import('./register-page').then((m) => m.RegisterPage),
  },
  {
    // Before ':id', so "print" is never read as an entry number.
    path: 'print',
    title: 'Risk register for print · Keelson',
    loadComponent: () => import('./register-print-page').then((m) => m.RegisterPrintPage),
  },
  {
    path: ':id',
    title: 'Register entry · Keelson',
    loadComponent: () => import('./register-entry-page').then((m) => m.RegisterEntryPage),
  },
];
