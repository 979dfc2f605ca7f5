import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { DashboardDto } from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** Data access for the home dashboard. */
@Injectable({ providedIn: 'root' })
export class DashboardApi {
  private readonly http = inject(HttpClient);

  /** GET /api/dashboard: the figures of the signed-in user's role. */
  get(): Observable<DashboardDto> {
    return this.http.get<DashboardDto>('/api/dashboard');
  }
}
