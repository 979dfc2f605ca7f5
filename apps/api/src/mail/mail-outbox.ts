/**
 * The outbox of notification e-mails. A message is written to `mail_outbox` before it is sent,
 * so none is lost: one the SMTP server does not take is tried again with growing pauses, and
 * one left waiting when the server stopped goes out after the next start. A caller with a
 * transaction writes its messages in it ({@link MailOutbox.enqueue}), so they exist exactly when
 * what they tell of was committed.
 */
import { and, asc, eq, inArray, lte, sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import { mailOutbox, type KeelsonDatabase, type MailOutboxRow } from '@keelson/db';
import type { Mailer, OutgoingMail } from './mailer';

/**
 * Pauses before the second, third, ... try; after the last the message is given up (`failed`)
 * and an administrator can send it again. The whole series spans about a day.
 */
export const MAIL_RETRY_DELAYS_MS: readonly number[] = [60_000, 5 * 60_000, 30 * 60_000,
  2 * 3_600_000, 12 * 3_600_000];

/** How often waiting messages are looked at while the app runs. */
export const MAIL_OUTBOX_POLL_MS = 60_000;

/** Messages tried in one pass, oldest due first. */
const BATCH = 50;

/** What an outbox is built from. */
export interface MailOutboxDeps {
  db: KeelsonDatabase;
  /** The SMTP mailer that actually sends. */
  mailer: Mailer;
  logger: Logger;
  now: () => Date;
  retryDelaysMs?: readonly number[];
}

/** The outbox's counts, for the administrators' page. */
export interface MailOutboxCounts {
  pending: number;
  failed: number;
}

/** Waiting and given-up messages of `db`'s outbox, counted (also for the home dashboard). */
export function unsentMailCounts(db: KeelsonDatabase): MailOutboxCounts {
  const rows = db.select({ status: mailOutbox.status, count: sql<number>`count(*)` })
    .from(mailOutbox).where(inArray(mailOutbox.status, ['pending', 'failed']))
    .groupBy(mailOutbox.status).all();
  const of = (status: string) => rows.find((row) => row.status === status)?.count ?? 0;
  return { pending: of('pending'), failed: of('failed') };
}

/** Writes, sends and re-sends notification e-mails. */
export class MailOutbox {
  private readonly delays: readonly number[];
  /** Ids being sent by this process: a pass never takes a message another pass holds. */
  private readonly inFlight = new Set<number>();
  private timer: NodeJS.Timeout | null = null;
  private passes = new Set<Promise<unknown>>();

  constructor(private readonly deps: MailOutboxDeps) {
    this.delays = deps.retryDelaysMs ?? MAIL_RETRY_DELAYS_MS;
  }

  /**
   * Writes `messages` as waiting, in `tx` when given (they then exist only if it commits), and
   * returns their ids. Nothing is sent until {@link deliver}.
   */
  enqueue(kind: string, messages: readonly OutgoingMail[], tx: KeelsonDatabase = this.deps.db):
    number[] {
    const empty = messages.find((message) => message.to.length === 0);
    if (empty) throw new Error(`E-mail "${empty.subject}" has no recipient.`);
    const at = this.deps.now().toISOString();
    return messages.map((message) => tx.insert(mailOutbox).values({ kind,
      toAddresses: message.to, subject: message.subject, text: message.text, html: message.html,
      status: 'pending', attempts: 0, nextAttemptAt: at, createdAt: at })
      .returning({ id: mailOutbox.id }).get().id);
  }

  /**
   * Writes `messages` and tries them at once; resolves to how many the SMTP server accepted.
   * Those it did not take stay waiting and are tried again later.
   */
  async send(kind: string, messages: readonly OutgoingMail[]): Promise<number> {
    return this.deliver(this.enqueue(kind, messages));
  }

  /**
   * Tries waiting messages: the ones of `ids` whatever their next try, or else those due now.
   * Resolves to how many were accepted. A refusal is logged and counted against the message.
   */
  deliver(ids?: readonly number[]): Promise<number> {
    const pass = this.pass(ids);
    this.passes.add(pass);
    void pass.finally(() => this.passes.delete(pass));
    return pass;
  }

  /**
   * Tries every unsent message now: waiting ones without waiting for their pause, given-up ones
   * from a fresh series of tries. Resolves to how many went out.
   */
  async sendUnsentNow(): Promise<number> {
    const ids = this.deps.db.transaction((tx) => {
      tx.update(mailOutbox).set({ status: 'pending', attempts: 0 })
        .where(eq(mailOutbox.status, 'failed')).run();
      return tx.select({ id: mailOutbox.id }).from(mailOutbox)
        .where(eq(mailOutbox.status, 'pending')).orderBy(asc(mailOutbox.id)).all()
        .map((row) => row.id);
    });
    return ids.length === 0 ? 0 : this.deliver(ids);
  }

  /** Waiting and given-up messages, counted. */
  counts(): MailOutboxCounts {
    return unsentMailCounts(this.deps.db);
  }

  /** Messages not sent yet (waiting or given up), oldest first. */
  unsent(limit = 100): MailOutboxRow[] {
    return this.deps.db.select().from(mailOutbox)
      .where(inArray(mailOutbox.status, ['pending', 'failed']))
      .orderBy(asc(mailOutbox.id)).limit(limit).all();
  }

  /**
   * Sends what was left waiting (a server stopped before its messages went out), then looks
   * for due messages every `pollMs`. The timer does not keep the process alive.
   */
  start(pollMs = MAIL_OUTBOX_POLL_MS): void {
    if (this.timer) return;
    void this.deliver();
    this.timer = setInterval(() => void this.deliver(), pollMs);
    this.timer.unref();
  }

  /** Stops the timer and waits for the passes under way. */
  async close(): Promise<void> {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    await Promise.allSettled([...this.passes]);
  }

  private async pass(ids?: readonly number[]): Promise<number> {
    const { db, now } = this.deps;
    const due = ids
      ? (ids.length === 0 ? [] : db.select().from(mailOutbox)
        .where(and(inArray(mailOutbox.id, [...ids]), eq(mailOutbox.status, 'pending')))
        .orderBy(asc(mailOutbox.id)).all())
      : db.select().from(mailOutbox)
        .where(and(eq(mailOutbox.status, 'pending'),
          lte(mailOutbox.nextAttemptAt, now().toISOString())))
        .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.id)).limit(BATCH).all();
    let sent = 0;
    for (const row of due) {
      if (this.inFlight.has(row.id)) continue;
      this.inFlight.add(row.id);
      try {
        sent += (await this.attempt(row)) ? 1 : 0;
      } finally {
        this.inFlight.delete(row.id);
      }
    }
    return sent;
  }

  private async attempt(row: MailOutboxRow): Promise<boolean> {
    const { db, mailer, logger, now } = this.deps;
    const attempts = row.attempts + 1;
    try {
      await mailer.send({ to: row.toAddresses, subject: row.subject, text: row.text,
        html: row.html });
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      const delay = this.delays[attempts - 1];
      const at = now();
      db.update(mailOutbox).set({ attempts, lastError: message.slice(0, 1000),
        status: delay === undefined ? 'failed' : 'pending',
        nextAttemptAt: new Date(at.getTime() + (delay ?? 0)).toISOString() })
        .where(eq(mailOutbox.id, row.id)).run();
      logger.error({ err: error, kind: row.kind, to: row.toAddresses, outboxId: row.id,
        attempts, givenUp: delay === undefined },
      delay === undefined ? 'gave up sending an e-mail' : 'could not send an e-mail; will try again');
      return false;
    }
    db.update(mailOutbox).set({ attempts, status: 'sent', sentAt: now().toISOString(),
      lastError: null }).where(eq(mailOutbox.id, row.id)).run();
    return true;
  }
}
