/**
 * The outbox through the API: administrators see the notification e-mails the SMTP server has
 * not taken (waiting and given up) and send them now; every other role gets 403.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MailOutboxDto, MailOutboxSentDto, Role } from '@keelson/contracts';
import { mailOutbox } from '@keelson/db';
import { caughtMail, clearMail } from '../notifications/notification-fixtures';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
}, 60_000);
afterAll(() => t.close());

const as = (role: Role) => ({ Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}` });
const row = (subject: string, status: 'pending' | 'failed' | 'sent', attempts: number) => ({
  kind: 'plan_submitted', toAddresses: ['plant.north@demo.test'], subject, text: subject,
  html: `<p>${subject}</p>`, status, attempts, lastError: status === 'sent' ? null : '451 later',
  // Waiting for an hour more: only "send now" sends it during the test.
  nextAttemptAt: '2026-03-02T10:00:00.000Z', createdAt: '2026-03-02T08:00:00.000Z',
  sentAt: status === 'sent' ? '2026-03-02T08:00:01.000Z' : null });

describe('/api/admin/mail/outbox', () => {
  it('lists the unsent e-mails and sends them now, for administrators only', async () => {
    clearMail(t.database.db);
    t.database.db.insert(mailOutbox).values([row('Waiting', 'pending', 2),
      row('Given up', 'failed', 6), row('Delivered', 'sent', 1)]).run();

    const listed = await request(t.app).get('/api/admin/mail/outbox').set(as('admin'));
    expect(listed.status).toBe(200);
    const outbox = listed.body as MailOutboxDto;
    expect([outbox.pending, outbox.failed]).toEqual([1, 1]);
    expect(outbox.items.map((item) => [item.subject, item.status, item.attempts, item.lastError]))
      .toEqual([['Waiting', 'pending', 2, '451 later'], ['Given up', 'failed', 6, '451 later']]);

    for (const role of ['risk_manager', 'buyer', 'plant_manager', 'viewer'] as const) {
      expect((await request(t.app).get('/api/admin/mail/outbox').set(as(role))).status).toBe(403);
      expect((await request(t.app).post('/api/admin/mail/outbox/send').set(as(role))).status)
        .toBe(403);
    }
    expect(caughtMail(t.database.db)).toEqual([]);

    const sent = await request(t.app).post('/api/admin/mail/outbox/send').set(as('admin'));
    expect(sent.status).toBe(200);
    expect(sent.body as MailOutboxSentDto).toEqual({ sent: 2, unsent: 0 });
    expect(caughtMail(t.database.db).map((message) => message.subject).sort())
      .toEqual(['Given up', 'Waiting']);
    const after = (await request(t.app).get('/api/admin/mail/outbox').set(as('admin')))
      .body as MailOutboxDto;
    expect(after).toEqual({ pending: 0, failed: 0, items: [] });
  });
});
