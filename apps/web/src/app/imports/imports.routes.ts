import type { Routes } from '@angular/router';

/** The buyer's import screens (guarded by the `imports` navigation entry in app.routes.ts). */
export const importsRoutes: Routes = [];
