import type { Routes } from '@angular/router';

/**
 * The network picture (`/risk`) and a supplier's risk page in a run
 * (`/risk/:runId/suppliers/:code`); guarded by the `risk` navigation entry in app.routes.ts.
 */
export const riskRoutes: Routes = [
  {
    path: '',
    title: 'Network picture · Keelson',
    loadComponent: () => import('./network-picture-page').then((m) => m.NetworkPicturePage),
  },
  {
    path: ':runId/suppliers/:code',
    title: 'Supplier risk · Keelson',
    loadComponent: () => import('./supplier-risk-page').then((m) => m.SupplierRiskPage),
  },
];
