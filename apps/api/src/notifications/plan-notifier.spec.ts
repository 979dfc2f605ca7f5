import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { mailOutbox } from '@keelson/db';
import type { Mailer } from '../mail/mailer';
import { createTestApp, type TestApp } from '../testing/test-app';
import {
  caughtMail,
  clearMail,
  insertEntry,
  insertPlan,
  insertTask,
  insertUser,
  mailTo,
  mountNotifications,
  recordingLogger,
  setActive,
  unsubscribe,
  type MountedNotifications,
} from './notification-fixtures';

// Plans and tasks are written straight into the database; the events are what the plans
// feature sends after its commit. Messages are read back from the SMTP sink's table.
const URL = 'http://keelson.test:4200';
let t: TestApp;
let mounted: MountedNotifications;
let id: Record<'admin' | 'buyer' | 'risk' | 'north' | 'south' | 'east' | 'viewer', number>;
let entryId: number;
let planId: number;

beforeAll(async () => {
  t = await createTestApp({ publicUrl: URL });
  mounted = mountNotifications(t);
  const db = t.database.db;
  id = {
    admin: t.userId('admin@demo.test'), buyer: t.userId('buyer@demo.test'),
    risk: t.userId('risk@demo.test'), north: t.userId('plant.north@demo.test'),
    south: t.userId('plant.south@demo.test'), east: t.userId('plant.east@demo.test'),
    viewer: t.userId('viewer@demo.test'),
  };
  entryId = insertEntry(db, { title: 'Kestrel Forgings is a single point of failure',
    ownerId: id.buyer, plants: ['P-NORTH', 'P-SOUTH'] });
  planId = insertPlan(db, { entryId, authorId: id.risk,
    description: 'Second forge <script>alert("owned")</script> & "quotes"' });
});
afterAll(async () => {
  await mounted.close();
  await t.close();
});
beforeEach(() => {
  clearMail(t.database.db);
  for (const userId of Object.values(id)) {
    unsubscribe(t.database.db, userId, []);
    setActive(t.database.db, userId, true);
  }
});

async function settle(): Promise<void> {
  await mounted.notifier.settled();
}

describe('planSubmitted', () => {
  it('e-mails each active manager of the plan\'s plants once, naming their plants', async () => {
    const both = insertUser(t.database.db, { email: 'plant.both@demo.test', name: 'Nils Both',
      role: 'plant_manager', plants: ['P-NORTH', 'P-EAST'] });
    const returned = mounted.notifier.planSubmitted({ planId, plants: ['P-NORTH', 'P-SOUTH'],
      byUserId: id.risk });
    expect(returned).toBeUndefined();
    await settle();
    const mail = caughtMail(t.database.db);
    expect(mail.map((message) => message.toAddresses).sort()).toEqual([
      ['plant.both@demo.test'], ['plant.north@demo.test'], ['plant.south@demo.test'],
    ]);
    const north = mailTo(t.database.db, 'plant.north@demo.test')[0]!;
    expect(north.subject).toBe('Plan waiting for your approval (P-NORTH): ' +
      'Kestrel Forgings is a single point of failure');
    for (const part of [north.text!, north.html!]) {
      expect(part).toContain(`${URL}/approvals`);
      expect(part).toContain(`${URL}/plans/${planId}`);
      expect(part).toContain(`${URL}/account`);
      expect(part).toContain('Rania Okafor');
      expect(part).toContain('Second source');
    }
    expect(north.text).toContain('It waits for your decision for P-NORTH.');
    expect(north.text).toContain('What-if: rating 12 (high) before, 4 (low) after; the ' +
      'supplier is a single point of failure before and not a single point of failure after');
    expect(north.text).toContain('You get this because you manage P-NORTH and a plan touching ' +
      `it waits for your approval; change which e-mails you get at ${URL}/account`);
    const bothMail = mailTo(t.database.db, 'plant.both@demo.test')[0]!;
    expect(bothMail.text).toContain('Your plants: P-NORTH');
    expect(bothMail.text).not.toContain('P-EAST');
    setActive(t.database.db, both, false);
  });

  it('escapes a hostile plan description in the HTML part and keeps it in the text', async () => {
    mounted.notifier.planSubmitted({ planId, plants: ['P-NORTH'], byUserId: id.risk });
    await settle();
    const message = mailTo(t.database.db, 'plant.north@demo.test')[0]!;
    expect(message.html).not.toContain('<script>');
    expect(message.html).toContain('&#60;script&#62;alert(&#34;owned&#34;)&#60;/script&#62; ' +
      '&#38; &#34;quotes&#34;');
    expect(message.text).toContain('Second forge <script>alert("owned")</script> & "quotes"');
  });

  it('warns when a plant of the plan has no active manager to e-mail', async () => {
    const logger = recordingLogger();
    const own = mountNotifications(t, { logger });
    setActive(t.database.db, id.east, false);
    own.notifier.planSubmitted({ planId, plants: ['P-NORTH', 'P-EAST', 'P-WEST'],
      byUserId: id.risk });
    await own.notifier.settled();
    expect(logger.warnings.map((args) => args[0])).toEqual([
      { planId, plants: ['P-EAST', 'P-WEST'] },
    ]);
    expect(caughtMail(t.database.db).map((message) => message.toAddresses))
      .toEqual([['plant.north@demo.test']]);
    await own.close();
  });

  it('skips a manager who switched plan_submitted off, and a deactivated one', async () => {
    unsubscribe(t.database.db, id.north, ['plan_submitted']);
    setActive(t.database.db, id.south, false);
    mounted.notifier.planSubmitted({ planId, plants: ['P-NORTH', 'P-SOUTH', 'P-EAST'],
      byUserId: id.risk });
    await settle();
    expect(caughtMail(t.database.db).map((message) => message.toAddresses))
      .toEqual([['plant.east@demo.test']]);
  });
});

describe('planDecided', () => {
  it('e-mails the author and the entry owner with the decision, not the decider', async () => {
    mounted.notifier.planDecided({ planId, plantCode: 'P-NORTH', decision: 'rejected',
      comment: 'The second forge has no <b>audit</b> yet.', byUserId: id.north,
      planStatus: 'draft' });
    await settle();
    const mail = caughtMail(t.database.db);
    expect(mail.map((message) => message.toAddresses[0]).sort())
      .toEqual(['buyer@demo.test', 'risk@demo.test']);
    const author = mailTo(t.database.db, 'risk@demo.test')[0]!;
    expect(author.subject).toBe('Plan rejected for P-NORTH: Kestrel Forgings is a single ' +
      'point of failure');
    expect(author.text).toContain(`Pia Lindqvist rejected plan ${planId} for "Kestrel ` +
      'Forgings is a single point of failure" (supplier S-2-SHARED-A) for plant P-NORTH.');
    expect(author.text).toContain('Decision: Rejected');
    expect(author.text).toContain('Plant: P-NORTH');
    expect(author.text).toContain('Comment: The second forge has no <b>audit</b> yet.');
    expect(author.text).toContain('Plan status now: Draft: change the plan and submit it again.');
    expect(author.text).toContain('You get this because you wrote this plan;');
    expect(author.html).toContain('no &#60;b&#62;audit&#60;/b&#62; yet');
    expect(author.html).not.toContain('<b>audit');
    for (const part of [author.text!, author.html!]) {
      expect(part).toContain(`${URL}/plans/${planId}`);
    }
    expect(mailTo(t.database.db, 'buyer@demo.test')[0]!.text)
      .toContain('You get this because you own its register entry;');
  });

  it('sends one message when the author owns the entry, none when they decided', async () => {
    const ownEntry = insertEntry(t.database.db, { title: 'Own entry', ownerId: id.risk,
      plants: ['P-SOUTH'] });
    const ownPlan = insertPlan(t.database.db, { entryId: ownEntry, authorId: id.risk });
    mounted.notifier.planDecided({ planId: ownPlan, plantCode: 'P-SOUTH', decision: 'approved',
      comment: '', byUserId: id.south, planStatus: 'approved' });
    await settle();
    const mail = caughtMail(t.database.db);
    expect(mail.map((message) => message.toAddresses)).toEqual([['risk@demo.test']]);
    expect(mail[0]!.text).toContain('Comment: (no comment)');
    expect(mail[0]!.text).toContain('Plan status now: Approved: every plant approved');
    expect(mail[0]!.text).toContain('because you wrote this plan and you own its register entry');
    clearMail(t.database.db);
    mounted.notifier.planDecided({ planId: ownPlan, plantCode: 'P-SOUTH', decision: 'approved',
      comment: '', byUserId: id.risk, planStatus: 'approved' });
    await settle();
    expect(caughtMail(t.database.db)).toEqual([]);
  });

  it('respects plan_decided switched off and skips a deactivated owner', async () => {
    unsubscribe(t.database.db, id.risk, ['plan_decided']);
    setActive(t.database.db, id.buyer, false);
    mounted.notifier.planDecided({ planId, plantCode: 'P-NORTH', decision: 'approved',
      comment: 'Fine.', byUserId: id.north, planStatus: 'submitted' });
    await settle();
    expect(caughtMail(t.database.db)).toEqual([]);
  });
});

describe('taskAssigned', () => {
  it('e-mails the assignee the task, its due date, plan and entry, with a link to tasks',
    async () => {
      const taskId = insertTask(t.database.db, { planId, title: 'Audit the <second> forge',
        ownerId: id.viewer, dueDate: '2026-04-15' });
      mounted.notifier.taskAssigned({ taskId, assigneeId: id.viewer, byUserId: id.risk });
      await settle();
      const mail = caughtMail(t.database.db);
      expect(mail.map((message) => message.toAddresses)).toEqual([['viewer@demo.test']]);
      const message = mail[0]!;
      expect(message.subject).toBe('Task assigned to you: Audit the <second> forge');
      expect(message.text).toContain('Rania Okafor assigned you a task of plan');
      expect(message.text).toContain('Due date: 2026-04-15');
      expect(message.text).toContain(`Plan: ${planId}: Second source (Waiting for approval)`);
      expect(message.text).toContain('Register entry: Kestrel Forgings is a single point of ' +
        'failure (supplier S-2-SHARED-A)');
      expect(message.html).toContain('Audit the &#60;second&#62; forge');
      for (const part of [message.text!, message.html!]) {
        expect(part).toContain(`${URL}/tasks`);
        expect(part).toContain(`${URL}/account`);
      }
    });

  it('sends nothing for a self-assignment, a switched-off kind or a deactivated user',
    async () => {
      const taskId = insertTask(t.database.db, { planId, title: 'Call the forge',
        ownerId: id.buyer, dueDate: null });
      mounted.notifier.taskAssigned({ taskId, assigneeId: id.buyer, byUserId: id.buyer });
      unsubscribe(t.database.db, id.viewer, ['task_assigned']);
      mounted.notifier.taskAssigned({ taskId, assigneeId: id.viewer, byUserId: id.risk });
      setActive(t.database.db, id.admin, false);
      mounted.notifier.taskAssigned({ taskId, assigneeId: id.admin, byUserId: id.risk });
      await settle();
      expect(caughtMail(t.database.db)).toEqual([]);
      // Control: the same task to an active, subscribed user goes out, named by Keelson.
      mounted.notifier.taskAssigned({ taskId, assigneeId: id.buyer, byUserId: null });
      await settle();
      const mail = caughtMail(t.database.db);
      expect(mail.map((message) => message.toAddresses)).toEqual([['buyer@demo.test']]);
      expect(mail[0]!.text).toContain('Keelson assigned you a task');
      expect(mail[0]!.text).toContain('Due date: no due date');
    });
});

describe('delivery failures', () => {
  it('never throws into the caller; logs a failed send and still sends the others',
    async () => {
      const logger = recordingLogger();
      let calls = 0;
      const flaky: Mailer = {
        async send(message) {
          calls += 1;
          if (message.to.includes('plant.north@demo.test')) throw new Error('SMTP said 451');
          await t.mailer.send(message);
        },
        close() {},
      };
      const own = mountNotifications(t, { mailer: flaky, logger });
      own.notifier.planSubmitted({ planId, plants: ['P-NORTH', 'P-SOUTH'], byUserId: id.risk });
      own.notifier.taskAssigned({ taskId: 999_999, assigneeId: id.viewer, byUserId: id.risk });
      await own.notifier.settled();
      expect(calls).toBe(2);
      expect(caughtMail(t.database.db).map((message) => message.toAddresses))
        .toEqual([['plant.south@demo.test']]);
      expect(logger.errors).toHaveLength(1);
      expect(logger.errors[0]![1]).toBe('could not send an e-mail; will try again');
      // The refused message waits in the outbox for its next try.
      const waiting = t.database.db.select().from(mailOutbox)
        .where(eq(mailOutbox.status, 'pending')).all();
      expect(waiting.map((row) => [row.kind, row.toAddresses, row.attempts, row.lastError]))
        .toEqual([['plan_submitted', ['plant.north@demo.test'], 1, 'SMTP said 451']]);
      await own.close();
    });

  it('logs an error while reading, without throwing', async () => {
    const logger = recordingLogger();
    const own = mountNotifications(t, { logger });
    // A plan id the database cannot bind makes the read itself fail.
    expect(() => own.notifier.planDecided({ planId: Symbol('bad') as unknown as number,
      plantCode: 'P-NORTH', decision: 'approved', comment: '', byUserId: id.north,
      planStatus: 'approved' })).not.toThrow();
    await own.notifier.settled();
    expect(logger.errors.map((args) => args[1])).toEqual([
      'could not prepare notification e-mails',
    ]);
    await own.close();
  });
});
