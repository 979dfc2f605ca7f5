import type { Routes } from '@angular/router';
import { navigationGuard } from '../shell/navigation';

/** The administrator's pages, each guarded by its entry in the navigation. */
export const adminRoutes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'users' },
  {
    path: 'users',
    title: 'Users · Keelson',
    canActivate: [navigationGuard('admin/users')],
    loadComponent: () => import('./users-page').then((m) => m.UsersPage),
  },
  {
    path: 'mail',
    title: 'Sent mail · Keelson',
    canActivate: [navigationGuard('admin/mail')],
    loadComponent: () => import('./mail-page').then((m) => m.MailPage),
  },
  {
    path: 'countries',
    title: 'Countries · Keelson',
    canActivate: [navigationGuard('admin/countries')],
    loadComponent: () => import('./countries-page').then((m) => m.CountriesPage),
  },
  {
    path: 'scoring',
    title: 'Scoring · Keelson',
    canActivate: [navigationGuard('admin/scoring')],
    loadComponent: () => import('./scoring-settings-page').then((m) => m.ScoringSettingsPage),
  },
  {
    path: 'audit',
    title: 'Audit trail · Keelson',
    canActivate: [navigationGuard('admin/audit')],
    loadComponent: () => import('./audit-page').then((m) => m.AuditPage),
  },
];
