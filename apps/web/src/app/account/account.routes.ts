import type { Routes } from '@angular/router';

/** `/account`: the signed-in user's e-mail settings (the guard is on the parent route). */
export const accountRoutes: Routes = [
  {
    path: '',
    title: 'E-mail settings · Keelson',
    loadComponent: () => import('./mail-settings-page').then((m) => m.MailSettingsPage),
  },
];
