import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import type { RunsService } from '../runs/runs.service';

/**
 * Mounts `/api/rescoring` (the quarterly re-scoring: start, list, resume, its schedule) and
 * starts the schedule.
 */
export function mountRescoringRoutes(_app: Express, _deps: FeatureDeps, _runs: RunsService): void {
  // Filled in by the re-scoring feature.
}
