import type { Routes } from '@angular/router';

/** The risk register (guarded by the `register` navigation entry in app.routes.ts). */
export const registerRoutes: Routes = [];
