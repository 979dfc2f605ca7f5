/**
 * The weekly digest of overdue tasks. A task is overdue when it is to do or doing, its due date
 * is before today (UTC) and its plan is approved or in progress (a draft's tasks are not on yet).
 *
 * Who gets it: every active user with overdue tasks gets one message listing theirs; every active
 * risk manager also gets the list of all overdue tasks, with owners, because they draft the plans
 * and follow them up (tasks whose owner is gone or deactivated appear only there). Nobody gets a
 * message when nothing is overdue, and a user who switched the digest off gets none.
 */
import type { Logger } from 'pino';
import type { DigestSentDto } from '@keelson/contracts';
import type { MailOutbox } from '../mail/mail-outbox';
import { todayOf } from '../plans/plan-rules';
import { digestEmail } from './notification-emails';
import type {
  MailRecipient,
  NotificationsRepository,
  OverdueTaskRow,
} from './notifications.repository';
import { wantsMail } from './plan-notifier';

/** What {@link sendOverdueDigest} needs. */
export interface OverdueDigestDeps {
  repository: NotificationsRepository;
  outbox: MailOutbox;
  logger: Logger;
  publicUrl: () => string;
}

/**
 * Sends the digest as of `now` and answers how many messages the mail server accepted and how
 * many tasks are overdue in all. A message the server refuses stays in the outbox to be tried
 * again; the others still go out.
 */
export async function sendOverdueDigest(
  deps: OverdueDigestDeps,
  now: Date,
): Promise<DigestSentDto> {
  const today = todayOf(now);
  const overdue = deps.repository.overdueTasks(today);
  if (overdue.length === 0) {
    return { recipients: 0, overdueTasks: 0 };
  }
  const ownByUser = new Map<number, OverdueTaskRow[]>();
  for (const task of overdue) {
    if (task.owner === null) continue;
    ownByUser.set(task.owner.id, [...(ownByUser.get(task.owner.id) ?? []), task]);
  }
  const byId = new Map<number, MailRecipient>();
  for (const recipient of [
    ...deps.repository.recipients([...ownByUser.keys()]),
    ...deps.repository.recipientsWithRole('risk_manager'),
  ]) {
    byId.set(recipient.id, recipient);
  }
  const publicUrl = deps.publicUrl();
  const messages = [...byId.values()]
    .filter((recipient) => wantsMail(recipient, 'digest'))
    .sort((a, b) => a.name.localeCompare(b.name) || a.id - b.id)
    .map((recipient) => digestEmail({
      recipient,
      own: ownByUser.get(recipient.id) ?? [],
      all: recipient.role === 'risk_manager' ? overdue : null,
      today,
      publicUrl,
    }));
  const sent = await deps.outbox.send('digest', messages);
  deps.logger.info({ recipients: sent, overdueTasks: overdue.length, today },
    'sent the digest of overdue tasks');
  return { recipients: sent, overdueTasks: overdue.length };
}
