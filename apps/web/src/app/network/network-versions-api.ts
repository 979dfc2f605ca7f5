import { HttpClient, HttpErrorResponse, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { NetworkVersionDto, Page } from '@keelson/contracts';
import { type Observable, catchError, of, throwError } from 'rxjs';

/** Data access for committed network versions (every role may read them). */
@Injectable({ providedIn: 'root' })
export class NetworkVersionsApi {
  private readonly http = inject(HttpClient);

  /** GET /api/network-versions: one page of versions, newest first. */
  list(limit = 50, offset = 0): Observable<Page<NetworkVersionDto>> {
    const params = new HttpParams().set('limit', String(limit)).set('offset', String(offset));
    return this.http.get<Page<NetworkVersionDto>>('/api/network-versions', { params });
  }

  /**
   * GET /api/network-versions/latest: the newest version, or null when nothing has been
   * imported yet (the API answers 404 then). Other failures pass through.
   */
  latest(): Observable<NetworkVersionDto | null> {
    return this.http.get<NetworkVersionDto>('/api/network-versions/latest').pipe(
      catchError((error: unknown) =>
        error instanceof HttpErrorResponse && error.status === 404
          ? of(null)
          : throwError(() => error),
      ),
    );
  }

  /** GET /api/network-versions/:id: one version with its counts and changes. */
  get(id: number): Observable<NetworkVersionDto> {
    return this.http.get<NetworkVersionDto>(`/api/network-versions/${id}`);
  }

  /**
   * Where the version's template workbook downloads from. A plain link is enough: the browser
   * sends the session cookie with a GET and saves the attachment itself.
   */
  exportUrl(id: number): string {
    return `/api/network-versions/${id}/export.xlsx`;
  }
}
