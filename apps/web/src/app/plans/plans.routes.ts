import type { Routes } from '@angular/router';

/**
 * Mitigation plans (guarded by the `register` navigation entry in app.routes.ts, since a plan
 * belongs to a register entry): a new draft for an entry, one plan, and its editor.
 */
export const plansRoutes: Routes = [
  {
    // Before ':id', so "new" is never read as a plan number.
    path: 'new',
    title: 'Draft a mitigation plan · Keelson',
    loadComponent: () => import('./plan-editor-page').then((m) => m.PlanEditorPage),
  },
  {
    path: ':id',
    title: 'Mitigation plan · Keelson',
    loadComponent: () => import('./plan-page').then((m) => m.PlanPage),
  },
  {
    path: ':id/edit',
    title: 'Edit the plan · Keelson',
    loadComponent: () => import('./plan-editor-page').then((m) => m.PlanEditorPage),
  },
];
