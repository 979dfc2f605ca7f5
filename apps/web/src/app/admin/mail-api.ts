import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  DigestSentDto,
  MailMessageDto,
  MailOutboxDto,
  MailOutboxSentDto,
  MailSummaryDto,
  Page,
} from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** Data access for the messages caught by the local mail sink (admin only). */
@Injectable({ providedIn: 'root' })
export class MailApi {
  private readonly http = inject(HttpClient);

  /** GET /api/admin/mail: one page of messages, newest first. */
  list(limit: number, offset: number): Observable<Page<MailSummaryDto>> {
    const params = new HttpParams().set('limit', String(limit)).set('offset', String(offset));
    return this.http.get<Page<MailSummaryDto>>('/api/admin/mail', { params });
  }

  /** GET /api/admin/mail/:id: one message with its text and HTML parts. */
  get(id: number): Observable<MailMessageDto> {
    return this.http.get<MailMessageDto>(`/api/admin/mail/${id}`);
  }

  /** GET /api/admin/mail/outbox: notification e-mails the mail server has not taken yet. */
  outbox(): Observable<MailOutboxDto> {
    return this.http.get<MailOutboxDto>('/api/admin/mail/outbox');
  }

  /** POST /api/admin/mail/outbox/send: tries every unsent e-mail now. */
  sendOutbox(): Observable<MailOutboxSentDto> {
    return this.http.post<MailOutboxSentDto>('/api/admin/mail/outbox/send', {});
  }

  /** POST /api/admin/digest: sends the weekly digest of overdue tasks now. */
  sendDigest(): Observable<DigestSentDto> {
    return this.http.post<DigestSentDto>('/api/admin/digest', {});
  }
}
