import type { Routes } from '@angular/router';

/** Filled in by the e-mail settings screen. */
export const accountRoutes: Routes = [];
