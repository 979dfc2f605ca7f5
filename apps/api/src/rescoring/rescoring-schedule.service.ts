/**
 * The re-scoring's timetable at work: the cron job started from the stored schedule, restarted
 * at once when an admin changes it, and the scheduled trigger itself (a re-scoring started by
 * the system; a quarter that has one already is simply done). The scheduler is injected (as for
 * the digest), so specs register a fake one and fire it with the test clock.
 */
import type { Logger } from 'pino';
import type { KeelsonDatabase } from '@keelson/db';
import type { RescoringScheduleDto, RescoringScheduleInput } from '@keelson/contracts';
import { recordAudit } from '../audit/audit-trail';
import { AppError } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { DigestScheduler, ScheduledJob } from '../notifications/digest-schedule';
import {
  checkSchedule,
  loadRescoringSchedule,
  saveRescoringSchedule,
  scheduleDto,
} from './rescoring-schedule';
import type { RescoringService } from './rescoring.service';

/** The name of the cron job. */
export const RESCORING_JOB_NAME = 'quarterly-rescoring';

/** Everything {@link RescoringScheduleService} is built from. */
export interface RescoringScheduleDeps {
  db: KeelsonDatabase;
  now: () => Date;
  logger: Logger;
  /** Null: keep the timetable but start no job (test mode). */
  scheduler: DigestScheduler | null;
  rescoring: RescoringService;
}

/** Reads, changes and runs the re-scoring's timetable. */
export class RescoringScheduleService {
  private job: ScheduledJob | null = null;

  constructor(private readonly deps: RescoringScheduleDeps) {}

  /** Starts the job of the stored timetable (none when disabled or without a scheduler). */
  start(): void {
    const { scheduler, logger } = this.deps;
    const stored = loadRescoringSchedule(this.deps.db);
    if (!scheduler || !stored.isEnabled) {
      logger.info({ isEnabled: stored.isEnabled, hasScheduler: scheduler !== null },
        'the quarterly re-scoring is not scheduled');
      return;
    }
    this.job = scheduler.schedule(stored.cron, () => this.fire(),
      { timezone: stored.timeZone, name: RESCORING_JOB_NAME });
    logger.info({ cron: stored.cron, timeZone: stored.timeZone },
      'scheduled the quarterly re-scoring');
  }

  /** Stops the job (the app is closing, or the timetable changes). */
  async stop(): Promise<void> {
    const job = this.job;
    this.job = null;
    await job?.stop();
  }

  /** The timetable with its next firing. */
  get(): RescoringScheduleDto {
    return scheduleDto(loadRescoringSchedule(this.deps.db), this.deps.now());
  }

  /** Checks and stores a new timetable (audited) and reschedules at once. */
  update(user: SessionUser, input: RescoringScheduleInput): RescoringScheduleDto {
    const now = this.deps.now();
    checkSchedule(input, now);
    this.deps.db.transaction((tx) => {
      const { updatedAt: _at, ...before } = loadRescoringSchedule(tx);
      saveRescoringSchedule(tx, input, now);
      recordAudit(tx, { action: 'rescoring.schedule_changed', subjectType: 'app_settings',
        subjectId: 'rescoring_schedule', userId: user.id, before: { ...before },
        after: { cron: input.cron, timeZone: input.timeZone, isEnabled: input.isEnabled } },
      now);
    });
    // The old job and the new one are separate tasks: no need to wait for the old to stop.
    void this.stop().catch((error: unknown) =>
      this.deps.logger.error({ err: error }, 'could not stop the old re-scoring job'));
    this.start();
    return this.get();
  }

  /**
   * The scheduled trigger: starts a re-scoring as the system for the quarter of now. A quarter
   * re-scored already, or no network yet, is logged; nothing throws into the scheduler.
   */
  async fire(): Promise<void> {
    const { logger } = this.deps;
    try {
      const started = this.deps.rescoring.start(null, { force: false }, 'schedule');
      logger.info({ rescoringId: started.id, quarterLabel: started.quarterLabel },
        'started the scheduled quarterly re-scoring');
    } catch (error) {
      if (error instanceof AppError && error.code === 'quarter_taken') {
        logger.info({ details: error.details }, 'the quarter was re-scored already; the ' +
          'scheduled re-scoring has nothing to do');
      } else if (error instanceof AppError && error.code === 'no_network') {
        logger.warn('the scheduled re-scoring found no network version to re-score');
      } else {
        logger.error({ err: error }, 'the scheduled quarterly re-scoring could not start');
      }
    }
  }
}
