import type { Routes } from '@angular/router';

/** My tasks (guarded by the `tasks` navigation entry; everyone signed in). */
export const tasksRoutes: Routes = [
  {
    path: '',
    title: 'My tasks · Keelson',
    loadComponent: () => import('./my-tasks-page').then((m) => m.MyTasksPage),
  },
];
