import type { Routes } from '@angular/router';

/** Approvals of mitigation plans (guarded by the `approvals` navigation entry). */
export const approvalsRoutes: Routes = [
  {
    path: '',
    title: 'Approvals · Keelson',
    loadComponent: () => import('./approvals-page').then((m) => m.ApprovalsPage),
  },
];
