import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { NODE_CRON_SCHEDULER, startDigestSchedule, type DigestScheduler } from './digest-schedule';
import { MailPreferencesService } from './mail-preferences.service';
import { createDigestRouter, createMailPreferencesRouter } from './notifications.router';
import { NotificationsRepository } from './notifications.repository';
import { sendOverdueDigest } from './overdue-digest';
import { createPlanNotifier, type PlanNotifier } from './plan-notifier';

/** Options of {@link mountNotificationRoutes}; specs inject the scheduler. */
export interface NotificationOptions {
  /** Runs the digest on its timetable; node-cron unless given. */
  scheduler?: DigestScheduler;
}

/**
 * Mounts `/api/me/mail-preferences` and `/api/admin/digest`, starts the weekly digest's
 * schedule (stopped through `deps.onClose`, after the e-mails still being sent are out), and
 * returns the listener that e-mails plan events.
 */
export function mountNotificationRoutes(
  app: Express,
  deps: FeatureDeps,
  options: NotificationOptions = {},
): PlanNotifier {
  const repository = new NotificationsRepository(deps.db);
  // Read per message: the server may learn its real port after the app is built.
  const publicUrl = () => deps.config.publicUrl;
  const mailDeps = { repository, outbox: deps.outbox, logger: deps.logger, publicUrl };
  const notifier = createPlanNotifier(mailDeps);
  const sendDigest = (now: Date) => sendOverdueDigest(mailDeps, now);

  const preferences = new MailPreferencesService({ db: deps.db, repository, now: deps.now });
  app.use('/api/me/mail-preferences', createMailPreferencesRouter(preferences));
  app.use('/api/admin/digest', createDigestRouter(() => sendDigest(deps.now())));

  const job = startDigestSchedule({
    config: deps.config,
    scheduler: options.scheduler ?? NODE_CRON_SCHEDULER,
    send: sendDigest,
    now: deps.now,
    logger: deps.logger,
  });
  deps.onClose(async () => {
    await job?.stop();
    await notifier.settled();
  });
  return notifier;
}
