import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { MailMessageDto, MailSummaryDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { MailPage, digestOutcome } from './mail-page';

const SUMMARY: MailSummaryDto = {
  id: 7,
  from: 'Keelson <no-reply@keelson.test>',
  to: ['ines.ward@demo.test'],
  subject: 'You are invited to Keelson',
  receivedAt: '2026-12-01T10:00:00.000Z',
};

const MESSAGE: MailMessageDto = {
  ...SUMMARY,
  text: 'Choose your password: http://127.0.0.1:3000/set-password?token=abc',
  html: '<p style="color:#1d6778">Choose your <a href="#">password</a></p><script>x()</script>',
};

describe('MailPage', () => {
  let fixture: ComponentFixture<MailPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [MailPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        // Dialogs close at once instead of waiting for an animation jsdom never plays.
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(MailPage);
    root = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
    const list = backend.expectOne((request) => request.url === '/api/admin/mail');
    expect(list.request.params.get('limit')).toBe('25');
    expect(list.request.params.get('offset')).toBe('0');
    list.flush({ items: [SUMMARY], total: 1 });
    backend.expectOne('/api/admin/mail/outbox').flush({ pending: 0, failed: 0, items: [] });
    await fixture.whenStable();
  });

  afterEach(() => backend.verify());

  it('lists the caught messages with received, to and subject', () => {
    const cells = [...root.querySelectorAll('tr.mat-mdc-row td')].map((cell) =>
      cell.textContent?.trim(),
    );
    expect(cells[1]).toBe('ines.ward@demo.test');
    expect(cells[2]).toBe('You are invited to Keelson');
    expect(cells[0]).toMatch(/2026/);
  });

  it('opens a message: text part as text, HTML part in a frame with an empty sandbox', async () => {
    root.querySelector<HTMLButtonElement>('button.mail__subject')!.click();
    await fixture.whenStable();
    backend.expectOne('/api/admin/mail/7').flush(MESSAGE);
    await fixture.whenStable();

    expect(root.querySelector('pre.mail__text')?.textContent).toBe(MESSAGE.text);
    const frame = root.querySelector<HTMLIFrameElement>('iframe.mail__html')!;
    expect(frame.getAttribute('sandbox')).toBe('');
    expect(frame.getAttribute('srcdoc')).toBe(MESSAGE.html);
    expect(root.querySelector('#mail-subject')?.textContent?.trim()).toBe(SUMMARY.subject);
  });

  it('says so when a message has no HTML part', async () => {
    root.querySelector<HTMLButtonElement>('button.mail__subject')!.click();
    await fixture.whenStable();
    backend.expectOne('/api/admin/mail/7').flush({ ...MESSAGE, html: null });
    await fixture.whenStable();
    expect(root.querySelector('iframe')).toBeNull();
    expect(root.textContent).toContain('This message has no HTML part.');
  });

  describe('Send the digest now', () => {
    function words(node: Element | null): string {
      return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
    }

    function button(label: string, within: ParentNode = root): HTMLButtonElement {
      return [...within.querySelectorAll<HTMLButtonElement>('button')].find((candidate) =>
        words(candidate).includes(label),
      )!;
    }

    async function openConfirm(): Promise<HTMLElement> {
      button('Send the digest now').click();
      await fixture.whenStable();
      return document.querySelector<HTMLElement>('mat-dialog-container')!;
    }

    it('asks first, sends, shows how many went out and refreshes the list', async () => {
      const dialog = await openConfirm();
      expect(words(dialog.querySelector('h2'))).toBe('Send the digest now?');
      expect(words(dialog)).toContain('switched the digest off get nothing');
      button('Send the digest', dialog).click();
      await fixture.whenStable();
      const post = backend.expectOne('/api/admin/digest');
      expect(post.request.method).toBe('POST');
      expect(post.request.headers.get('x-keelson-csrf')).toBe('1');
      expect(button('Sending the digest…').disabled).toBe(true);
      post.flush({ recipients: 3, overdueTasks: 5 });
      await fixture.whenStable();
      expect(words(root.querySelector('.mail__digest')))
        .toBe('Digest sent to 3 people, covering 5 overdue tasks.');
      expect(words(document.querySelector('mat-snack-bar-container')))
        .toContain('Digest sent to 3 people');
      const reload = backend.expectOne((request) => request.url === '/api/admin/mail');
      expect(reload.request.params.get('offset')).toBe('0');
      const digest: MailSummaryDto = { ...SUMMARY, id: 8, to: ['buyer@demo.test'],
        subject: 'Overdue tasks: 2 assigned to you' };
      reload.flush({ items: [digest, SUMMARY], total: 2 });
      await fixture.whenStable();
      expect(root.querySelectorAll('button.mail__subject')).toHaveLength(2);
      expect(words(root.querySelector('button.mail__subject')))
        .toBe('Overdue tasks: 2 assigned to you');
      expect(button('Send the digest now').disabled).toBe(false);
    });

    it('sends nothing when the administrator cancels', async () => {
      const dialog = await openConfirm();
      button('Cancel', dialog).click();
      await fixture.whenStable();
      backend.expectNone('/api/admin/digest');
      expect(root.querySelector('.mail__digest')).toBeNull();
    });

    it('says why the digest was not sent', async () => {
      const dialog = await openConfirm();
      button('Send the digest', dialog).click();
      await fixture.whenStable();
      backend.expectOne('/api/admin/digest').flush(
        { error: { code: 'forbidden', message: 'This needs the role Administrator.' } },
        { status: 403, statusText: 'Forbidden' },
      );
      await fixture.whenStable();
      expect(words(root.querySelector('.mail__digest')))
        .toBe('The digest was not sent: This needs the role Administrator.');
      expect(button('Send the digest now').disabled).toBe(false);
    });

    it('words the outcome for none, one and many', () => {
      expect(digestOutcome({ recipients: 0, overdueTasks: 0 }))
        .toBe('No task is overdue, so no digest was sent.');
      expect(digestOutcome({ recipients: 1, overdueTasks: 1 }))
        .toBe('Digest sent to 1 person, covering 1 overdue task.');
    });
  });
});
