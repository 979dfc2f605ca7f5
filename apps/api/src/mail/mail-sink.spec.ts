import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { startMailSink } from './mail-sink';
import { MailRepository } from './mail.repository';
import { createSmtpMailer } from './mailer';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('the local SMTP sink', () => {
  it('stores a message sent over SMTP with both parts, recipients and size', async () => {
    await t.mailer.send({
      to: ['one@demo.test', 'Two@Demo.test'],
      subject: 'Plan approved: P-NORTH — bearings',
      text: 'Plain part with ü and a link http://keelson.test/plans/1',
      html: '<p>HTML part with <b>ü</b></p>',
    });
    const { rows, total } = t.mail.list(10, 0);
    expect(total).toBe(1);
    const stored = rows[0]!;
    expect(stored.toAddresses).toEqual(['one@demo.test', 'two@demo.test']);
    expect(stored.subject).toBe('Plan approved: P-NORTH — bearings');
    expect(stored.text?.trim()).toBe('Plain part with ü and a link http://keelson.test/plans/1');
    expect(stored.html).toContain('<b>ü</b>');
    expect(stored.rawSize).toBeGreaterThan(200);
    expect(stored.receivedAt).toMatch(/^\d{4}-\d{2}-\d{2}T/);
  });

  it('refuses a message over its size limit and stores nothing', async () => {
    const mail = new MailRepository(t.database.db);
    const small = await startMailSink({ mail, logger: silentLogger(), maxBytes: 2048 });
    const mailer = createSmtpMailer({ host: small.host, port: small.port }, 'k@localhost');
    const before = mail.list(100, 0).total;
    try {
      await expect(
        mailer.send({
          to: ['big@demo.test'],
          subject: 'Big',
          text: 'x'.repeat(10_000),
          html: '<p>x</p>',
        }),
      ).rejects.toThrow(/552|size|exceed/i);
      expect(mail.list(100, 0).total).toBe(before);
    } finally {
      mailer.close();
      await small.stop();
    }
  });
});

describe('GET /api/admin/mail', () => {
  it('lists caught messages newest first and shows one in full to an administrator', async () => {
    await t.mailer.send({ to: ['later@demo.test'], subject: 'Later', text: 'T', html: '<i>H</i>' });
    const admin = `Bearer ${t.tokenFor('admin@demo.test')}`;
    const list = await request(t.app).get('/api/admin/mail?limit=1').set('Authorization', admin);
    expect(list.status).toBe(200);
    expect(list.body.total).toBeGreaterThanOrEqual(2);
    expect(list.body.items).toHaveLength(1);
    const summary = list.body.items[0];
    expect(summary).toMatchObject({ subject: 'Later', to: ['later@demo.test'] });
    expect(summary.text).toBeUndefined();
    const full = await request(t.app)
      .get(`/api/admin/mail/${summary.id}`)
      .set('Authorization', admin);
    expect(full.body).toMatchObject({ subject: 'Later', html: '<i>H</i>' });
    expect(full.body.text.trim()).toBe('T');
    const missing = await request(t.app)
      .get('/api/admin/mail/999999')
      .set('Authorization', admin);
    expect(missing.status).toBe(404);
  });

  it('refuses a risk manager', async () => {
    const response = await request(t.app)
      .get('/api/admin/mail')
      .set('Authorization', `Bearer ${t.tokenFor('risk@demo.test')}`);
    expect(response.status).toBe(403);
  });
});

function silentLogger() {
  return { error: () => undefined } as unknown as Parameters<typeof startMailSink>[0]['logger'];
}
