import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AuditListDto, ListAuditQuery } from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** The audit trail's filters and paging; every field is optional. */
export type AuditQuery = Partial<ListAuditQuery>;

/** Turns a query into URL parameters, leaving out empty values. */
export function auditQueryParams(query: AuditQuery): HttpParams {
  let params = new HttpParams();
  for (const key of ['action', 'subjectType', 'subjectId', 'from', 'to', 'q'] as const) {
    const value = query[key]?.trim();
    if (value) params = params.set(key, value);
  }
  for (const key of ['userId', 'limit', 'offset'] as const) {
    const value = query[key];
    if (value !== undefined) params = params.set(key, String(value));
  }
  return params;
}

/** Data access for the whole audit trail (admin only). */
@Injectable({ providedIn: 'root' })
export class AuditApi {
  private readonly http = inject(HttpClient);

  /** GET /api/audit: one page of the filtered trail, newest first, with the total. */
  list(query: AuditQuery = {}): Observable<AuditListDto> {
    return this.http.get<AuditListDto>('/api/audit', { params: auditQueryParams(query) });
  }

  /**
   * Where the trail's workbook downloads from, with the same filters (every match, no paging).
   * A plain link is enough: the browser sends the session cookie with a GET.
   */
  exportUrl(query: AuditQuery = {}): string {
    const { limit: _limit, offset: _offset, ...filters } = query;
    const params = auditQueryParams(filters).toString();
    return params ? `/api/audit/export.xlsx?${params}` : '/api/audit/export.xlsx';
  }
}
