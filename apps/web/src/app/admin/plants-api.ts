import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { PlantDto } from '@keelson/contracts';
import { type Observable, map } from 'rxjs';

/** Data access for the organisation's plants. */
@Injectable({ providedIn: 'root' })
export class PlantsApi {
  private readonly http = inject(HttpClient);

  /** GET /api/plants: every plant of the workspace. */
  list(): Observable<PlantDto[]> {
    return this.http.get<{ items: PlantDto[] }>('/api/plants').pipe(map((body) => body.items));
  }
}
