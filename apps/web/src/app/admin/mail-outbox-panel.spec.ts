import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { MailOutboxDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { MailOutboxPanel, outboxSendOutcome, outboxSummary } from './mail-outbox-panel';

const OUTBOX: MailOutboxDto = {
  pending: 1,
  failed: 1,
  items: [
    { id: 3, kind: 'plan_submitted', to: ['plant.north@demo.test'],
      subject: 'Plan waiting for your approval', status: 'pending', attempts: 2,
      nextAttemptAt: '2026-12-02T10:06:00.000Z', lastError: '451 try later',
      createdAt: '2026-12-02T10:00:00.000Z' },
    { id: 4, kind: 'digest', to: ['risk@demo.test'], subject: 'Overdue tasks', status: 'failed',
      attempts: 6, nextAttemptAt: '2026-12-02T22:36:00.000Z', lastError: '550 no such user',
      createdAt: '2026-12-01T10:00:00.000Z' },
  ],
};

describe('outboxSummary and outboxSendOutcome', () => {
  it('say what waits, what was given up and what went out', () => {
    expect(outboxSummary({ pending: 0, failed: 0 }))
      .toBe('Every notification e-mail has been taken by the mail server.');
    expect(outboxSummary({ pending: 1, failed: 0 }))
      .toBe('1 e-mail the mail server did not take waits to be tried again.');
    expect(outboxSummary({ pending: 2, failed: 3 })).toBe('2 e-mails the mail server did not ' +
      'take wait to be tried again; 3 e-mails were given up after the last try.');
    expect(outboxSendOutcome({ sent: 2, unsent: 0 })).toBe('2 e-mails sent; none is waiting.');
    expect(outboxSendOutcome({ sent: 1, unsent: 1 })).toBe('1 e-mail sent; 1 still not taken ' +
      'by the mail server, tried again later.');
  });
});

describe('MailOutboxPanel', () => {
  let fixture: ComponentFixture<MailOutboxPanel>;
  let backend: HttpTestingController;
  let root: HTMLElement;
  const words = (element: Element | null) => element?.textContent?.replace(/\s+/g, ' ').trim();

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [MailOutboxPanel],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(MailOutboxPanel);
    root = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  });

  afterEach(() => backend.verify());

  it('says so in one line when nothing is waiting', async () => {
    backend.expectOne('/api/admin/mail/outbox').flush({ pending: 0, failed: 0, items: [] });
    await fixture.whenStable();
    expect(words(root)).toBe('done_all Every notification e-mail has been taken by the mail ' +
      'server.');
    expect(root.querySelector('table')).toBeNull();
  });

  it('lists what was not sent with its state and error, and sends it now', async () => {
    backend.expectOne('/api/admin/mail/outbox').flush(OUTBOX);
    await fixture.whenStable();
    const rows = [...root.querySelectorAll('tr.mat-mdc-row')].map((row) =>
      [...row.querySelectorAll('td')].map((cell) => words(cell)));
    expect(rows.map((row) => [row[0], row[1], row[3]])).toEqual([
      ['Plan waiting for your approval', 'plant.north@demo.test', '451 try later'],
      ['Overdue tasks', 'risk@demo.test', '550 no such user']]);
    expect(rows[0]![2]).toMatch(/^Next try .+ \(2 so far\)$/);
    expect(rows[1]![2]).toBe('Given up after 6 tries');
    let sentEvents = 0;
    fixture.componentInstance.sent.subscribe(() => sentEvents++);
    const send = [...root.querySelectorAll<HTMLButtonElement>('button')]
      .find((button) => words(button)?.includes('Send them now'))!;
    send.click();
    await fixture.whenStable();
    const post = backend.expectOne('/api/admin/mail/outbox/send');
    expect(post.request.method).toBe('POST');
    post.flush({ sent: 2, unsent: 0 });
    backend.expectOne('/api/admin/mail/outbox').flush({ pending: 0, failed: 0, items: [] });
    await fixture.whenStable();
    expect(sentEvents).toBe(1);
    expect(root.querySelector('table')).toBeNull();
  });

  it('names the failure when the outbox cannot be read', async () => {
    backend.expectOne('/api/admin/mail/outbox').flush(
      { error: { code: 'forbidden', message: 'Only an administrator can do this.' } },
      { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();
    expect(words(root.querySelector('[role="alert"]'))).toContain('The outbox could not be read');
  });
});
