import type { Routes } from '@angular/router';

/** Browsing a network version (guarded by the `network` navigation entry in app.routes.ts). */
export const networkRoutes: Routes = [];
