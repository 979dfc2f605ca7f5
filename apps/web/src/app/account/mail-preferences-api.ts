import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { MailPreferencesDto } from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** Data access for the signed-in user's choice of e-mails. */
@Injectable({ providedIn: 'root' })
export class MailPreferencesApi {
  private readonly http = inject(HttpClient);

  /** GET /api/me/mail-preferences: the kinds switched off. */
  get(): Observable<MailPreferencesDto> {
    return this.http.get<MailPreferencesDto>('/api/me/mail-preferences');
  }

  /** PUT /api/me/mail-preferences: stores the kinds switched off; answers what was stored. */
  save(preferences: MailPreferencesDto): Observable<MailPreferencesDto> {
    return this.http.put<MailPreferencesDto>('/api/me/mail-preferences', preferences);
  }
}
