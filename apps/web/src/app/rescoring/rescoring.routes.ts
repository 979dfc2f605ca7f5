import type { Routes } from '@angular/router';

/**
 * The quarterly re-scoring (guarded by the `rescoring` navigation entry in app.routes.ts):
 * - `/rescoring`: what it does, the schedule, starting one, the list with live progress and the
 *   trends per quarter;
 * - `/rescoring/compare?from=&to=`: what changed between two runs, with its workbook.
 */
export const rescoringRoutes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Quarterly re-scoring · Keelson',
    loadComponent: () => import('./rescoring-page').then((m) => m.RescoringPage),
  },
  {
    path: 'compare',
    title: 'What changed · Keelson',
    loadComponent: () => import('./compare-page').then((m) => m.ComparePage),
  },
];
