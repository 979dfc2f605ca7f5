import type { Routes } from '@angular/router';

/**
 * Browsing a network version (guarded by the `network` navigation entry in app.routes.ts):
 * - `/network`: the latest version, or the empty state before the first import;
 * - `/network/:versionId/suppliers|products|items`: the version's tables (state in the URL);
 * - `/network/:versionId/products/:code?plant=`: a product's bill of materials, level by level;
 * - `/network/:versionId/suppliers/:code`: one supplier, on a page of its own.
 */
export const networkRoutes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Network · Keelson',
    loadComponent: () => import('./network-landing-page').then((m) => m.NetworkLandingPage),
  },
  {
    // Before `:versionId` with its children, so a supplier opens on its own page.
    path: ':versionId/suppliers/:code',
    title: 'Supplier · Keelson',
    loadComponent: () => import('./supplier-page').then((m) => m.SupplierPage),
  },
  {
    path: ':versionId',
    loadComponent: () => import('./network-version-page').then((m) => m.NetworkVersionPage),
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'suppliers' },
      {
        path: 'suppliers',
        title: 'Suppliers · Network · Keelson',
        loadComponent: () => import('./suppliers-table').then((m) => m.SuppliersTable),
      },
      {
        path: 'products',
        title: 'Products · Network · Keelson',
        loadComponent: () => import('./products-table').then((m) => m.ProductsTable),
      },
      {
        path: 'products/:code',
        title: 'Bill of materials · Network · Keelson',
        loadComponent: () => import('./bom-page').then((m) => m.BomPage),
      },
      {
        path: 'items',
        title: 'Items · Network · Keelson',
        loadComponent: () => import('./items-table').then((m) => m.ItemsTable),
      },
    ],
  },
];
