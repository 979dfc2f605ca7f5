import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { MailMessageDto, MailSummaryDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { MailPage } from './mail-page';

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
});
