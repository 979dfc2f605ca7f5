import type { Routes } from '@angular/router';
import { navigationGuard } from '../shell/navigation';

/**
 * Analysis runs (guarded by the `runs` navigation entry in app.routes.ts):
 * - `/runs`: the list of runs, starting and cancelling, live progress;
 * - `/runs/scenarios`: failure sets evaluated on a network version (its own navigation entry);
 * - `/runs/:runId`: one run's ranking, heat map and Pareto chart (state in the URL).
 */
export const runsRoutes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Analysis runs · Keelson',
    loadComponent: () => import('./runs-page').then((m) => m.RunsPage),
  },
  {
    // Before `:runId`, so "scenarios" is never read as a run id.
    path: 'scenarios',
    title: 'Scenarios · Keelson',
    canActivate: [navigationGuard('runs/scenarios')],
    loadComponent: () => import('./scenarios-page').then((m) => m.ScenariosPage),
  },
  {
    path: ':runId',
    title: 'Run · Keelson',
    loadComponent: () => import('./run-page').then((m) => m.RunPage),
  },
];
