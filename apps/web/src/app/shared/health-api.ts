import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { HealthDto } from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** Data access for the server's health endpoint. */
@Injectable({ providedIn: 'root' })
export class HealthApi {
  private readonly http = inject(HttpClient);

  /** GET /api/health: status, database, version and the mode the server runs in. */
  get(): Observable<HealthDto> {
    return this.http.get<HealthDto>('/api/health');
  }
}
