import type { Routes } from '@angular/router';

/** Filled in by the re-scoring screens (`/rescoring`, `/rescoring/compare`). */
export const rescoringRoutes: Routes = [];
