import type { Routes } from '@angular/router';

/** Filled in by the plans screens. */
export const plansRoutes: Routes = [];
