import type { Routes } from '@angular/router';

/** The supplier risk page and the network picture (guarded by the `risk` navigation entry in app.routes.ts). */
export const riskRoutes: Routes = [];
