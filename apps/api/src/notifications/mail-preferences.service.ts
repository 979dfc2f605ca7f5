import { MAIL_KINDS, type MailKind, type MailPreferencesDto } from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { recordAudit } from '../audit/audit-trail';
import type { NotificationsRepository } from './notifications.repository';

/** What {@link MailPreferencesService} needs. */
export interface MailPreferencesServiceDeps {
  db: KeelsonDatabase;
  repository: NotificationsRepository;
  now: () => Date;
}

/** Each user's choice of which e-mails to get (every kind, unless switched off). */
export class MailPreferencesService {
  constructor(private readonly deps: MailPreferencesServiceDeps) {}

  /** The kinds `userId` switched off, in the order of {@link MAIL_KINDS}. */
  get(userId: number): MailPreferencesDto {
    return { unsubscribed: inKindOrder(this.deps.repository.unsubscribedOf(userId)) };
  }

  /**
   * Stores the kinds `userId` switches off (duplicates dropped) and, when that changes them,
   * records `user.mail_preferences_changed` in the same transaction.
   */
  save(userId: number, input: MailPreferencesDto): MailPreferencesDto {
    const unsubscribed = inKindOrder(input.unsubscribed);
    const now = this.deps.now();
    this.deps.db.transaction((tx) => {
      // One better-sqlite3 connection: the repository's statements run inside this transaction.
      const repository = this.deps.repository;
      const before = inKindOrder(repository.unsubscribedOf(userId));
      repository.saveUnsubscribed(userId, unsubscribed, now);
      if (before.join() !== unsubscribed.join()) {
        recordAudit(tx, { action: 'user.mail_preferences_changed', subjectType: 'user',
          subjectId: userId, userId, before: { unsubscribed: before },
          after: { unsubscribed } }, now);
      }
    });
    return { unsubscribed };
  }
}

function inKindOrder(kinds: readonly MailKind[]): MailKind[] {
  const chosen = new Set(kinds);
  return MAIL_KINDS.filter((kind) => chosen.has(kind));
}
