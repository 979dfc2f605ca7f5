import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { NODE_CRON_SCHEDULER, type DigestScheduler } from '../notifications/digest-schedule';
import type { RunsService } from '../runs/runs.service';
import { RescoringScheduleService } from './rescoring-schedule.service';
import { createRescoringRouter } from './rescoring.router';
import { RescoringService } from './rescoring.service';

/** Options of {@link mountRescoringRoutes}; specs inject the scheduler. */
export interface RescoringOptions {
  /**
   * Runs the timetable: node-cron by default, none in test mode (so test apps start no
   * timers) unless a spec passes its own.
   */
  scheduler?: DigestScheduler | null;
}

/** What {@link mountRescoringRoutes} built (specs reach for the services). */
export interface MountedRescoring {
  rescoring: RescoringService;
  schedule: RescoringScheduleService;
}

/**
 * Mounts `/api/rescoring` (the quarterly re-scoring: start, list, resume, cancel, its schedule)
 * and starts the schedule. Called after the runs module marked the runs a previous process left
 * unfinished as failed: the re-scorings those runs belonged to become `interrupted` here (they
 * keep their quarter's lock) and wait to be resumed or restarted. The job is stopped and the
 * e-mails still being sent are awaited through `deps.onClose`.
 */
export function mountRescoringRoutes(app: Express, deps: FeatureDeps, runs: RunsService,
  options: RescoringOptions = {}): MountedRescoring {
  // Read per message: the server may learn its real port after the app is built.
  const publicUrl = () => deps.config.publicUrl;
  const rescoring = new RescoringService({ db: deps.db, now: deps.now, logger: deps.logger,
    runs, outbox: deps.outbox, publicUrl });
  const interrupted = rescoring.interruptUnfinished();
  if (interrupted > 0) {
    deps.logger.warn({ rescorings: interrupted },
      'marked re-scorings a restart interrupted; resume or restart them');
  }
  const scheduler = options.scheduler !== undefined ? options.scheduler
    : deps.config.mode === 'test' ? null : NODE_CRON_SCHEDULER;
  const schedule = new RescoringScheduleService({ db: deps.db, now: deps.now,
    logger: deps.logger, scheduler, rescoring });
  schedule.start();
  app.use('/api/rescoring', createRescoringRouter({ rescoring, schedule }));
  deps.onClose(async () => {
    await schedule.stop();
    await rescoring.settled();
  });
  return { rescoring, schedule };
}
