import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';

/** How the server runs: `demo` seeds demo accounts; `production` and `test` do not. */
export type ServerMode = 'demo' | 'production' | 'test';

/** GET /api/health answer. `mode` may be missing from older servers. */
export interface HealthDto {
  status: string;
  db: string;
  version: string;
  mode?: ServerMode;
}

/** Data access for the server's health endpoint. */
@Injectable({ providedIn: 'root' })
export class HealthApi {
  private readonly http = inject(HttpClient);

  /** GET /api/health. */
  get(): Observable<HealthDto> {
    return this.http.get<HealthDto>('/api/health');
  }
}
