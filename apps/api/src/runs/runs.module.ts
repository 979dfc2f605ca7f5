import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { RunResultsService } from './run-results.service';
import { createRunsRouter } from './runs.router';
import { RunsService, type Analyser } from './runs.service';
import { createScenarioEvaluationRouter, createScenariosRouter } from './scenarios.router';
import { ScenariosRepository } from './scenarios.repository';
import { ScenariosService } from './scenarios.service';

/** Options of {@link mountRunRoutes} (specs replace the engine runner). */
export interface RunRoutesOptions {
  analyser?: Analyser;
}

/**
 * Mounts /api/analysis-runs, /api/scenarios and POST /api/network-versions/:id/scenario. On
 * start, runs that a previous process left queued or running are marked failed: their worker
 * died with that process, so they would otherwise wait forever. Returns the run service.
 */
export function mountRunRoutes(
  app: Express,
  deps: FeatureDeps,
  options: RunRoutesOptions = {},
): RunsService {
  const { graphs } = deps;
  const runs = new RunsService({ db: deps.db, now: deps.now, analyser: options.analyser });
  const interrupted = runs.failInterrupted();
  if (interrupted > 0) {
    deps.logger.warn({ runs: interrupted }, 'marked runs interrupted by a restart as failed');
  }
  const results = new RunResultsService(deps.db, graphs);
  const scenarios = new ScenariosService({ repository: new ScenariosRepository(deps.db), graphs,
    now: deps.now });
  app.use('/api/analysis-runs', createRunsRouter({ runs, results }));
  app.use('/api/scenarios', createScenariosRouter(scenarios));
  app.use('/api/network-versions', createScenarioEvaluationRouter(scenarios));
  return runs;
}
