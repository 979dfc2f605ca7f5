/**
 * The digest's timetable: a cron job (node-cron) at `config.digestSchedule` in
 * `config.digestTimeZone` that calls the digest with the time it fires. The scheduler is
 * injected, so specs check what is registered and fire it by hand instead of waiting for Monday.
 */
import cron from 'node-cron';
import type { Logger } from 'pino';
import type { AppConfig } from '../config/app-config';

/** A started job. */
export interface ScheduledJob {
  stop(): void | Promise<void>;
}

/** Runs `run` at each time `expression` matches in `timezone`. */
export interface DigestScheduler {
  schedule(
    expression: string,
    run: () => Promise<void>,
    options: { timezone: string; name: string },
  ): ScheduledJob;
}

/** The real scheduler: node-cron, without overlapping runs; stopping destroys the job. */
export const NODE_CRON_SCHEDULER: DigestScheduler = {
  schedule(expression, run, options) {
    const task = cron.schedule(expression, run, { ...options, noOverlap: true });
    return { stop: () => task.destroy() };
  },
};

/** What {@link startDigestSchedule} needs. */
export interface DigestScheduleOptions {
  config: Pick<AppConfig, 'digestSchedule' | 'digestTimeZone'>;
  scheduler: DigestScheduler;
  /** The digest (`sendOverdueDigest` bound to its dependencies). */
  send: (now: Date) => Promise<unknown>;
  now: () => Date;
  logger: Logger;
}

/**
 * Starts the schedule and returns its job, or null when the config switches the digest off
 * (`KEELSON_DIGEST_CRON=off`). A failing digest is logged; the schedule keeps running.
 */
export function startDigestSchedule(options: DigestScheduleOptions): ScheduledJob | null {
  const { config, logger } = options;
  if (config.digestSchedule === null) {
    logger.info('the digest of overdue tasks is not scheduled (KEELSON_DIGEST_CRON=off)');
    return null;
  }
  const job = options.scheduler.schedule(
    config.digestSchedule,
    async () => {
      try {
        await options.send(options.now());
      } catch (error) {
        logger.error({ err: error }, 'the scheduled digest of overdue tasks failed');
      }
    },
    { timezone: config.digestTimeZone, name: 'overdue-digest' },
  );
  logger.info({ schedule: config.digestSchedule, timeZone: config.digestTimeZone },
    'scheduled the digest of overdue tasks');
  return job;
}
