import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { mailOutbox } from '@keelson/db';
import { MAIL_RETRY_DELAYS_MS, MailOutbox } from '../mail/mail-outbox';
import { createTestApp, type TestApp } from '../testing/test-app';
import {
  caughtMail,
  clearMail,
  insertEntry,
  insertPlan,
  insertTask,
  insertUser,
  mailTo,
  recordingLogger,
  unsubscribe,
} from './notification-fixtures';
import { daysOverdue } from './notification-emails';
import { NotificationsRepository } from './notifications.repository';
import { todayOf } from '../plans/plan-rules';
import { sendOverdueDigest, type OverdueDigestDeps } from './overdue-digest';

// A fixed Monday morning. "Overdue" = to do or doing, due before 2026-03-09 (UTC), and the plan
// approved or in progress. The expected lists below follow from the rows, written by hand.
const NOW = new Date('2026-03-09T07:00:00.000Z');
const URL = 'http://keelson.test:4200';
let t: TestApp;
let deps: OverdueDigestDeps;

beforeAll(async () => {
  t = await createTestApp({ publicUrl: URL });
  const db = t.database.db;
  const buyer = t.userId('buyer@demo.test');
  const north = t.userId('plant.north@demo.test');
  const viewer = t.userId('viewer@demo.test');
  const risk = t.userId('risk@demo.test');
  const gone = insertUser(db, { email: 'gone@demo.test', name: 'Gunnar Gone', role: 'buyer',
    isActive: false });
  insertUser(db, { email: 'risk.old@demo.test', name: 'Olga Former', role: 'risk_manager',
    isActive: false });
  const entry = insertEntry(db, { title: 'Kestrel Forgings', plants: ['P-NORTH'] });
  const approved = insertPlan(db, { entryId: entry, authorId: risk, status: 'approved' });
  const running = insertPlan(db, { entryId: entry, authorId: risk, status: 'in_progress' });
  const draft = insertPlan(db, { entryId: entry, authorId: risk, status: 'draft' });
  const done = insertPlan(db, { entryId: entry, authorId: risk, status: 'done' });
  insertTask(db, { planId: approved, title: 'A: audit the forge', ownerId: buyer,
    dueDate: '2026-03-02' });
  insertTask(db, { planId: running, title: 'B: sample parts', ownerId: buyer,
    dueDate: '2026-03-08', status: 'doing' });
  insertTask(db, { planId: approved, title: 'C: due today', ownerId: buyer,
    dueDate: '2026-03-09' });
  insertTask(db, { planId: approved, title: 'D: already done', ownerId: north,
    dueDate: '2026-03-01', status: 'done' });
  insertTask(db, { planId: draft, title: 'E: draft plan', ownerId: north,
    dueDate: '2026-02-01' });
  insertTask(db, { planId: done, title: 'E2: finished plan', ownerId: north,
    dueDate: '2026-02-01' });
  insertTask(db, { planId: approved, title: 'F: viewer task', ownerId: viewer,
    dueDate: '2026-03-05' });
  insertTask(db, { planId: approved, title: 'G: owner deactivated', ownerId: gone,
    dueDate: '2026-03-04' });
  insertTask(db, { planId: approved, title: 'H: cancelled', ownerId: null,
    dueDate: '2026-03-03', status: 'cancelled' });
  insertTask(db, { planId: approved, title: 'I: nobody owns it', ownerId: null,
    dueDate: '2026-03-06' });
  insertTask(db, { planId: approved, title: 'J: no due date', ownerId: buyer, dueDate: null });
  unsubscribe(db, viewer, ['digest']);
  const logger = recordingLogger();
  deps = { repository: new NotificationsRepository(db),
    outbox: new MailOutbox({ db, mailer: t.mailer, logger, now: () => t.clock.now }),
    logger, publicUrl: () => URL };
});
afterAll(() => t.close());
beforeEach(() => clearMail(t.database.db));

describe('sendOverdueDigest', () => {
  it('sends one message to each owner with overdue tasks and one to each risk manager',
    async () => {
      const sent = await sendOverdueDigest(deps, NOW);
      // A, B (buyer), F (viewer), G (deactivated owner), I (no owner).
      expect(sent).toEqual({ recipients: 2, overdueTasks: 5 });
      expect(caughtMail(t.database.db).map((message) => message.toAddresses[0]).sort())
        .toEqual(['buyer@demo.test', 'risk@demo.test']);
    });

  it('lists an owner\'s own overdue tasks, oldest first, with days overdue', async () => {
    await sendOverdueDigest(deps, NOW);
    const message = mailTo(t.database.db, 'buyer@demo.test')[0]!;
    expect(message.subject).toBe('Overdue tasks: 2 assigned to you');
    const lines = message.text!.split('\n').filter((line) => line.startsWith('- '));
    expect(lines).toEqual([
      '- A: audit the forge: due 2026-03-02, 7 days overdue; plan 1 for "Kestrel Forgings" ' +
        '(supplier S-2-SHARED-A)',
      '- B: sample parts: due 2026-03-08, 1 day overdue; plan 2 for "Kestrel Forgings" ' +
        '(supplier S-2-SHARED-A)',
    ]);
    expect(message.text).toContain('were due before 2026-03-09 (UTC)');
    expect(message.html).toContain('<li>A: audit the forge: due 2026-03-02, 7 days overdue;');
    for (const part of [message.text!, message.html!]) {
      expect(part).toContain(`${URL}/tasks`);
      expect(part).toContain(`${URL}/account`);
    }
    expect(message.text).toContain('You get this because you have overdue tasks;');
  });

  it('gives a risk manager every overdue task with its owner', async () => {
    await sendOverdueDigest(deps, NOW);
    const message = mailTo(t.database.db, 'risk@demo.test')[0]!;
    expect(message.subject).toBe('Overdue tasks: 5 in all');
    expect(message.text).toContain('All overdue tasks (5), as you are a risk manager');
    const owners = message.text!.split('\n').filter((line) => line.startsWith('- '))
      .map((line) => line.replace(/^- (\w+):.*; (owner [^;]+|no owner);.*$/, '$1 $2'));
    expect(owners).toEqual(['A owner Bruno Keller', 'G owner Gunnar Gone (deactivated)',
      'F owner Vera Novak', 'I no owner', 'B owner Bruno Keller']);
    expect(message.text).toContain('You get this because you are a risk manager;');
  });

  it('respects the digest switched off: the risk manager who opts out gets none', async () => {
    unsubscribe(t.database.db, t.userId('risk@demo.test'), ['digest']);
    try {
      expect(await sendOverdueDigest(deps, NOW)).toEqual({ recipients: 1, overdueTasks: 5 });
      expect(caughtMail(t.database.db).map((message) => message.toAddresses))
        .toEqual([['buyer@demo.test']]);
    } finally {
      unsubscribe(t.database.db, t.userId('risk@demo.test'), []);
    }
  });

  it('sends nothing when nothing is overdue', async () => {
    expect(await sendOverdueDigest(deps, new Date('2026-02-01T07:00:00.000Z')))
      .toEqual({ recipients: 0, overdueTasks: 0 });
    expect(caughtMail(t.database.db)).toEqual([]);
  });

  it('counts only the messages the mail server accepted', async () => {
    const logger = recordingLogger();
    const db = t.database.db;
    const refusing = { ...deps, logger, outbox: new MailOutbox({ db, logger,
      now: () => t.clock.now,
      mailer: { send: () => Promise.reject(new Error('down')), close() {} } }) };
    expect(await sendOverdueDigest(refusing, NOW)).toEqual({ recipients: 0, overdueTasks: 5 });
    expect(logger.errors).toHaveLength(2);
    // Nothing is lost: both wait in the outbox, and go out on a later pass once the server works.
    const waiting = db.select().from(mailOutbox).where(eq(mailOutbox.status, 'pending')).all()
      .filter((row) => row.kind === 'digest');
    expect(waiting.map((row) => [row.attempts, row.lastError])).toEqual([[1, 'down'], [1, 'down']]);
    const before = t.clock.now;
    t.clock.now = new Date(before.getTime() + MAIL_RETRY_DELAYS_MS[0]!);
    expect(await deps.outbox.deliver()).toBe(2);
    t.clock.now = before;
    expect(caughtMail(db).map((message) => message.toAddresses[0]).sort())
      .toEqual(['buyer@demo.test', 'risk@demo.test']);
  });
});

describe('dates', () => {
  it('takes today in UTC and counts whole days', () => {
    expect(todayOf(new Date('2026-03-08T23:30:00.000-02:00'))).toBe('2026-03-09');
    expect(daysOverdue('2026-02-27', '2026-03-02')).toBe(3);
  });
});
