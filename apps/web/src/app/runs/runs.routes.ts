import type { Routes } from '@angular/router';

/** Analysis runs, the ranking, heat map, Pareto and scenarios (guarded by the `runs` navigation entry in app.routes.ts). */
export const runsRoutes: Routes = [];
