import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ScoringSettings } from '@keelson/scoring';
import type { Observable } from 'rxjs';

/** Data access for the register's scoring settings (everyone reads them; admins change them). */
@Injectable({ providedIn: 'root' })
export class ScoringSettingsApi {
  private readonly http = inject(HttpClient);

  /** GET /api/settings/scoring: the settings in force. */
  get(): Observable<ScoringSettings> {
    return this.http.get<ScoringSettings>('/api/settings/scoring');
  }

  /** PUT /api/settings/scoring: replaces the settings; the register is scored again with them. */
  save(settings: ScoringSettings): Observable<ScoringSettings> {
    return this.http.put<ScoringSettings>('/api/settings/scoring', settings);
  }
}
