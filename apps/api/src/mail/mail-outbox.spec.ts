/**
 * The outbox: written before it sends, retried on the schedule of MAIL_RETRY_DELAYS_MS with a
 * moved clock (no waiting), given up after the last try and sent again on an administrator's
 * word, written in a caller's transaction (gone with a rollback), and what a stopped server
 * left waiting goes out when a new outbox starts on the same database.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { IN_MEMORY, mailOutbox, openDatabase, type OpenDatabase } from '@keelson/db';
import { recordingLogger } from '../notifications/notification-fixtures';
import { MAIL_RETRY_DELAYS_MS, MailOutbox } from './mail-outbox';
import type { Mailer, OutgoingMail } from './mailer';

const mail = (n: number): OutgoingMail => ({ to: [`person${n}@demo.test`],
  subject: `Message ${n}`, text: `Text ${n}`, html: `<p>Text ${n}</p>` });

/** A mailer that refuses while `down` is true and records what it took. */
function scriptedMailer(): Mailer & { down: boolean; accepted: OutgoingMail[] } {
  const mailer = {
    down: false,
    accepted: [] as OutgoingMail[],
    async send(message: OutgoingMail) {
      if (mailer.down) throw new Error('421 service not available');
      mailer.accepted.push(message);
    },
    close() {},
  };
  return mailer;
}

let database: OpenDatabase;
let clock: { now: Date };
let mailer: ReturnType<typeof scriptedMailer>;
let outbox: MailOutbox;
const rows = () => database.db.select().from(mailOutbox).all();
const later = (ms: number) => { clock.now = new Date(clock.now.getTime() + ms); };

beforeEach(() => {
  database = openDatabase(IN_MEMORY);
  clock = { now: new Date('2026-03-02T09:00:00.000Z') };
  mailer = scriptedMailer();
  outbox = new MailOutbox({ db: database.db, mailer, logger: recordingLogger(),
    now: () => clock.now });
});
afterEach(async () => {
  await outbox.close();
  database.close();
});

describe('MailOutbox', () => {
  it('writes each message before sending it and marks it sent', async () => {
    expect(await outbox.send('digest', [mail(1), mail(2)])).toBe(2);
    expect(mailer.accepted.map((message) => message.subject)).toEqual(['Message 1', 'Message 2']);
    expect(rows().map((row) => [row.kind, row.status, row.attempts, row.sentAt])).toEqual([
      ['digest', 'sent', 1, '2026-03-02T09:00:00.000Z'],
      ['digest', 'sent', 1, '2026-03-02T09:00:00.000Z']]);
    // A sent message is never sent again.
    later(24 * 3_600_000);
    expect(await outbox.deliver()).toBe(0);
    expect(mailer.accepted).toHaveLength(2);
  });

  it('tries a refused message again after each pause, then gives up', async () => {
    mailer.down = true;
    expect(await outbox.send('plan_submitted', [mail(1)])).toBe(0);
    const tries: [number, string, string][] = [];
    for (const delay of MAIL_RETRY_DELAYS_MS) {
      const [row] = rows();
      tries.push([row!.attempts, row!.status, row!.nextAttemptAt]);
      // Not due a moment before the pause is over.
      later(delay - 1);
      expect(await outbox.deliver()).toBe(0);
      expect(rows()[0]!.attempts).toBe(row!.attempts);
      later(1);
      expect(await outbox.deliver()).toBe(0);
    }
    // 1 min, 5 min, 30 min, 2 h, 12 h after the first try at 09:00 (added by hand).
    expect(tries).toEqual([
      [1, 'pending', '2026-03-02T09:01:00.000Z'],
      [2, 'pending', '2026-03-02T09:06:00.000Z'],
      [3, 'pending', '2026-03-02T09:36:00.000Z'],
      [4, 'pending', '2026-03-02T11:36:00.000Z'],
      [5, 'pending', '2026-03-02T23:36:00.000Z'],
    ]);
    expect(rows()[0]).toMatchObject({ status: 'failed', attempts: 6,
      lastError: '421 service not available', sentAt: null });
    expect(outbox.counts()).toEqual({ pending: 0, failed: 1 });

    mailer.down = false;
    later(7 * 24 * 3_600_000);
    expect(await outbox.deliver()).toBe(0);
    expect(await outbox.sendUnsentNow()).toBe(1);
    expect(rows()[0]).toMatchObject({ status: 'sent', attempts: 1, lastError: null });
    expect(outbox.counts()).toEqual({ pending: 0, failed: 0 });
  });

  it('sends the others when one is refused', async () => {
    const picky: Mailer = { async send(message) {
      if (message.subject === 'Message 2') throw new Error('550 mailbox unavailable');
      mailer.accepted.push(message);
    }, close() {} };
    const own = new MailOutbox({ db: database.db, mailer: picky, logger: recordingLogger(),
      now: () => clock.now });
    expect(await own.send('digest', [mail(1), mail(2), mail(3)])).toBe(2);
    expect(rows().map((row) => row.status)).toEqual(['sent', 'pending', 'sent']);
    expect(own.unsent().map((row) => row.subject)).toEqual(['Message 2']);
  });

  it('writes in the caller\'s transaction: a rollback leaves no message', async () => {
    expect(() => database.db.transaction((tx) => {
      outbox.enqueue('rescoring', [mail(1)], tx);
      throw new Error('the re-scoring failed');
    })).toThrow('the re-scoring failed');
    expect(rows()).toEqual([]);
    const ids = database.db.transaction((tx) => outbox.enqueue('rescoring', [mail(2)], tx));
    expect(await outbox.deliver(ids)).toBe(1);
    expect(mailer.accepted.map((message) => message.subject)).toEqual(['Message 2']);
  });

  it('sends on start what a stopped server left waiting, and polls for due retries', async () => {
    // The server wrote its messages and stopped before sending them.
    outbox.enqueue('rescoring', [mail(1), mail(2)]);
    const next = new MailOutbox({ db: database.db, mailer, logger: recordingLogger(),
      now: () => clock.now });
    next.start(10);
    await expect.poll(() => mailer.accepted.length).toBe(2);
    // A refused message is taken up by the timer once due.
    mailer.down = true;
    expect(await next.send('digest', [mail(3)])).toBe(0);
    mailer.down = false;
    later(MAIL_RETRY_DELAYS_MS[0]!);
    await expect.poll(() => mailer.accepted.map((message) => message.subject))
      .toEqual(['Message 1', 'Message 2', 'Message 3']);
    await next.close();
  });

  it('refuses a message without a recipient before writing anything', () => {
    expect(() => outbox.enqueue('digest', [mail(1), { ...mail(2), to: [] }]))
      .toThrow('E-mail "Message 2" has no recipient.');
    expect(rows()).toEqual([]);
  });
});
