import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AuditHistoryDto } from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** Data access for one subject's history in the audit trail. */
@Injectable({ providedIn: 'root' })
export class HistoryApi {
  private readonly http = inject(HttpClient);

  /**
   * GET /api/audit/history/:subjectType/:subjectId: the subject's records, newest first. A
   * register entry's history includes its plans and their tasks; a plan's includes its tasks.
   */
  history(subjectType: string, subjectId: string | number): Observable<AuditHistoryDto> {
    const path = `${encodeURIComponent(subjectType)}/${encodeURIComponent(String(subjectId))}`;
    return this.http.get<AuditHistoryDto>(`/api/audit/history/${path}`);
  }
}
