import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '@keelson/contracts';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import {
  caughtMail,
  clearMail,
  insertEntry,
  insertPlan,
  insertTask,
  unsubscribe,
} from './notification-fixtures';

// Through the real app: the routes as mounted by app.ts, signed in as each demo account.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  const db = t.database.db;
  const entry = insertEntry(db, { title: 'Kestrel Forgings', plants: ['P-NORTH'] });
  const plan = insertPlan(db, { entryId: entry, authorId: t.userId('risk@demo.test'),
    status: 'in_progress' });
  // The test clock stands at 2026-03-02: both tasks are overdue.
  insertTask(db, { planId: plan, title: 'Audit the forge', ownerId: t.userId('buyer@demo.test'),
    dueDate: '2026-02-23' });
  insertTask(db, { planId: plan, title: 'Sample parts',
    ownerId: t.userId('plant.north@demo.test'), dueDate: '2026-03-01', status: 'doing' });
});
afterAll(() => t.close());

const as = (role: Role) => ({ Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}` });
const issuePaths = (body: { error: { details?: { issues?: { path: string }[] } } }) =>
  (body.error.details?.issues ?? []).map((issue) => issue.path);

describe('/api/me/mail-preferences', () => {
  it('answers every kind switched on for each role until a choice is saved', async () => {
    for (const role of ROLES) {
      const response = await request(t.app).get('/api/me/mail-preferences').set(as(role));
      expect(response.status, role).toBe(200);
      expect(response.body).toEqual({ unsubscribed: [] });
    }
  });

  it('saves a choice with the session cookie and reads it back, in the kinds\' order',
    async () => {
      const cookie = await t.signIn('viewer@demo.test');
      const saved = await request(t.app).put('/api/me/mail-preferences')
        .set(t.cookieHeaders(cookie))
        .send({ unsubscribed: ['digest', 'plan_submitted', 'digest'] });
      expect(saved.status).toBe(200);
      expect(saved.body).toEqual({ unsubscribed: ['plan_submitted', 'digest'] });
      const read = await request(t.app).get('/api/me/mail-preferences')
        .set(t.cookieHeaders(cookie));
      expect(read.body).toEqual({ unsubscribed: ['plan_submitted', 'digest'] });
      // Another user's choice is their own.
      const other = await request(t.app).get('/api/me/mail-preferences').set(as('buyer'));
      expect(other.body).toEqual({ unsubscribed: [] });
      const back = await request(t.app).put('/api/me/mail-preferences')
        .set(t.cookieHeaders(cookie)).send({ unsubscribed: [] });
      expect(back.body).toEqual({ unsubscribed: [] });
    });

  it('records a change in the audit trail, and nothing when the choice stays the same',
    async () => {
      const userId = t.userId('plant.south@demo.test');
      const count = () => (t.database.sqlite.prepare(
        "select count(*) as n from audit_events where action = 'user.mail_preferences_changed' " +
        'and subject_id = ?').get(String(userId)) as { n: number }).n;
      const put = (unsubscribed: string[]) => request(t.app).put('/api/me/mail-preferences')
        .set({ Authorization: `Bearer ${t.tokenFor('plant.south@demo.test')}` })
        .send({ unsubscribed });
      await put(['task_assigned']);
      await put(['task_assigned']);
      expect(count()).toBe(1);
      const row = t.database.sqlite.prepare(
        "select user_id as userId, before, after from audit_events where action = " +
        "'user.mail_preferences_changed' and subject_id = ?").get(String(userId)) as
        { userId: number; before: string; after: string };
      expect(row.userId).toBe(userId);
      expect(JSON.parse(row.before)).toEqual({ unsubscribed: [] });
      expect(JSON.parse(row.after)).toEqual({ unsubscribed: ['task_assigned'] });
    });

  it('refuses a kind it does not know and a missing list, naming the field', async () => {
    const unknown = await request(t.app).put('/api/me/mail-preferences').set(as('buyer'))
      .send({ unsubscribed: ['plan_decided', 'newsletter'] });
    expect(unknown.status).toBe(400);
    expect(issuePaths(unknown.body)).toEqual(['body.unsubscribed.1']);
    expect(unknown.body.error.message).toContain('body.unsubscribed.1');
    const missing = await request(t.app).put('/api/me/mail-preferences').set(as('buyer'))
      .send({});
    expect(missing.status).toBe(400);
    expect(issuePaths(missing.body)).toEqual(['body.unsubscribed']);
    const read = await request(t.app).get('/api/me/mail-preferences').set(as('buyer'));
    expect(read.body).toEqual({ unsubscribed: [] });
  });

  it('needs a session, and the CSRF header with the cookie', async () => {
    expect((await request(t.app).get('/api/me/mail-preferences')).status).toBe(401);
    const cookie = await t.signIn('buyer@demo.test');
    const response = await request(t.app).put('/api/me/mail-preferences')
      .set('Cookie', cookie).send({ unsubscribed: ['digest'] });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_missing');
  });
});

describe('POST /api/admin/digest', () => {
  it('sends the digest now for an administrator and answers how many went out', async () => {
    clearMail(t.database.db);
    const response = await request(t.app).post('/api/admin/digest').set(as('admin'));
    expect(response.status).toBe(200);
    // The buyer and the plant manager own one task each; the risk manager gets both.
    expect(response.body).toEqual({ recipients: 3, overdueTasks: 2 });
    expect(caughtMail(t.database.db).map((message) => message.toAddresses[0]).sort())
      .toEqual(['buyer@demo.test', 'plant.north@demo.test', 'risk@demo.test']);
  });

  it('leaves out whoever switched the digest off', async () => {
    clearMail(t.database.db);
    unsubscribe(t.database.db, t.userId('buyer@demo.test'), ['digest']);
    const response = await request(t.app).post('/api/admin/digest').set(as('admin'));
    expect(response.body).toEqual({ recipients: 2, overdueTasks: 2 });
    unsubscribe(t.database.db, t.userId('buyer@demo.test'), []);
  });

  it('refuses every other role with 403 and sends nothing', async () => {
    clearMail(t.database.db);
    for (const role of ROLES.filter((candidate) => candidate !== 'admin')) {
      const response = await request(t.app).post('/api/admin/digest').set(as(role));
      expect(response.status, role).toBe(403);
      expect(response.body.error.code).toBe('forbidden');
      expect(response.body.error.message).toContain('Administrator');
    }
    expect(caughtMail(t.database.db)).toEqual([]);
  });
});
