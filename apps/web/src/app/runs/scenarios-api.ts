import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  FailureSet,
  NetworkSupplierDto,
  Page,
  SaveScenarioInput,
  ScenarioDto,
  ScenarioResultDto,
} from '@keelson/contracts';
import { type Observable, map } from 'rxjs';
import { browseParams } from '../network/network-browse-api';

/** Suppliers the failure-set search offers at once. */
export const SUPPLIER_SUGGESTIONS = 20;

/**
 * Data access for scenarios: evaluating a failure set on a network version, the saved failure
 * sets, and the supplier search the failure-set builder uses.
 */
@Injectable({ providedIn: 'root' })
export class ScenariosApi {
  private readonly http = inject(HttpClient);

  /** POST /api/network-versions/:id/scenario: what the failure set would cost on a version. */
  evaluate(versionId: number, failureSet: FailureSet): Observable<ScenarioResultDto> {
    return this.http.post<ScenarioResultDto>(
      `/api/network-versions/${versionId}/scenario`,
      failureSet,
    );
  }

  /** GET /api/scenarios: the saved failure sets. */
  list(): Observable<ScenarioDto[]> {
    return this.http
      .get<Page<ScenarioDto> | { items: ScenarioDto[] }>('/api/scenarios')
      .pipe(map((body) => body.items));
  }

  /** POST /api/scenarios: saves a failure set under a name. */
  save(input: SaveScenarioInput): Observable<ScenarioDto> {
    return this.http.post<ScenarioDto>('/api/scenarios', input);
  }

  /** PUT /api/scenarios/:id: replaces a saved failure set. */
  update(id: number, input: SaveScenarioInput): Observable<ScenarioDto> {
    return this.http.put<ScenarioDto>(`/api/scenarios/${id}`, input);
  }

  /** DELETE /api/scenarios/:id. */
  remove(id: number): Observable<unknown> {
    return this.http.delete(`/api/scenarios/${id}`);
  }

  /** GET /api/network-versions/:id/suppliers?q=: suppliers matching the search text. */
  searchSuppliers(versionId: number, q: string): Observable<NetworkSupplierDto[]> {
    return this.http
      .get<Page<NetworkSupplierDto>>(`/api/network-versions/${versionId}/suppliers`, {
        params: browseParams({ q, limit: SUPPLIER_SUGGESTIONS }),
      })
      .pipe(map((page) => page.items));
  }
}
