/**
 * The e-mails of plan events: the {@link PlanEvents} listener the plans feature calls after a
 * commit. Each call returns at once; the reading and sending run in the background, one message
 * per recipient, and a failure is logged, never thrown back into the plan's request.
 */
import type { Logger } from 'pino';
import type { MailKind } from '@keelson/contracts';
import type { MailOutbox } from '../mail/mail-outbox';
import type { OutgoingMail } from '../mail/mailer';
import type {
  PlanDecidedEvent,
  PlanEvents,
  PlanSubmittedEvent,
  TaskAssignedEvent,
} from '../plans/plan-events';
import { planDecidedEmail, planSubmittedEmail, taskAssignedEmail } from './notification-emails';
import type { MailRecipient, NotificationsRepository } from './notifications.repository';

/** The listener, plus a way for specs and shutdown to wait for what is still being sent. */
export interface PlanNotifier extends PlanEvents {
  /** Resolves when every delivery started so far has finished (sent or logged as failed). */
  settled(): Promise<void>;
}

/** What {@link createPlanNotifier} needs. */
export interface PlanNotifierDeps {
  repository: NotificationsRepository;
  /** Writes each message before sending it, and tries again those the server refuses. */
  outbox: MailOutbox;
  logger: Logger;
  /** Read at each delivery: the server learns its real port after the app is built. */
  publicUrl: () => string;
}

/** Whether `recipient` gets a message of `kind`: active, and has not switched it off. */
export function wantsMail(recipient: MailRecipient, kind: MailKind): boolean {
  return recipient.isActive && !recipient.unsubscribed.includes(kind);
}

/** Builds the listener. */
export function createPlanNotifier(deps: PlanNotifierDeps): PlanNotifier {
  const { repository, outbox, logger } = deps;
  const pending = new Set<Promise<void>>();

  const deliver = (kind: MailKind, event: object, build: () => OutgoingMail[]): void => {
    try {
      const job: Promise<void> = Promise.resolve()
        .then(async () => {
          await outbox.send(kind, build());
        })
        .catch((error: unknown) => {
          logger.error({ err: error, kind, event }, 'could not prepare notification e-mails');
        })
        .finally(() => pending.delete(job));
      pending.add(job);
    } catch (error) {
      // Promise machinery does not throw, but the contract is never to throw into the caller.
      logger.error({ err: error, kind, event }, 'could not queue notification e-mails');
    }
  };

  const nameOf = (userId: number | null): string | null =>
    userId === null ? null : (repository.recipients([userId])[0]?.name ?? null);

  return {
    planSubmitted(event: PlanSubmittedEvent) {
      deliver('plan_submitted', event, () => {
        const plan = repository.plan(event.planId);
        if (!plan) return [];
        const submittedBy = nameOf(event.byUserId) ?? 'A risk manager';
        const managers = repository.managersOf(event.plants);
        const managed = new Set(managers.flatMap(({ recipient, plants }) =>
          recipient.isActive ? plants : []));
        const unmanaged = event.plants.filter((plant) => !managed.has(plant));
        if (unmanaged.length > 0) {
          // Nobody can approve for these plants: say so where an administrator will look.
          logger.warn({ planId: event.planId, plants: unmanaged },
            'a submitted plan touches plants without an active plant manager');
        }
        return managers
          .filter(({ recipient }) => recipient.id !== event.byUserId &&
            wantsMail(recipient, 'plan_submitted'))
          .map(({ recipient, plants }) => planSubmittedEmail({
            recipient, plan, plants, submittedBy, publicUrl: deps.publicUrl(),
          }));
      });
    },

    planDecided(event: PlanDecidedEvent) {
      deliver('plan_decided', event, () => {
        const plan = repository.plan(event.planId);
        if (!plan) return [];
        const ids = [plan.authorId, plan.entry.ownerId]
          .filter((id): id is number => id !== null && id !== event.byUserId);
        const decidedBy = nameOf(event.byUserId) ?? 'A plant manager';
        return repository.recipients([...new Set(ids)])
          .filter((recipient) => wantsMail(recipient, 'plan_decided'))
          .map((recipient) => planDecidedEmail({
            recipient, plan, decidedBy, publicUrl: deps.publicUrl(),
            plantCode: event.plantCode, decision: event.decision, comment: event.comment,
            planStatus: event.planStatus,
            isAuthor: recipient.id === plan.authorId,
            isEntryOwner: recipient.id === plan.entry.ownerId,
          }));
      });
    },

    taskAssigned(event: TaskAssignedEvent) {
      deliver('task_assigned', event, () => {
        if (event.byUserId === event.assigneeId) return [];
        const task = repository.task(event.taskId);
        if (!task) return [];
        return repository.recipients([event.assigneeId])
          .filter((recipient) => wantsMail(recipient, 'task_assigned'))
          .map((recipient) => taskAssignedEmail({
            recipient, task, assignedBy: nameOf(event.byUserId), publicUrl: deps.publicUrl(),
          }));
      });
    },

    async settled() {
      while (pending.size > 0) {
        await Promise.allSettled([...pending]);
      }
    },
  };
}
