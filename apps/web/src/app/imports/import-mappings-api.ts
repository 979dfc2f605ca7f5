import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ImportMappingDto, SaveImportMappingInput } from '@keelson/contracts';
import { type Observable, map } from 'rxjs';

/** Data access for saved column mappings. */
@Injectable({ providedIn: 'root' })
export class ImportMappingsApi {
  private readonly http = inject(HttpClient);

  /** GET /api/import-mappings: every saved mapping. */
  list(): Observable<ImportMappingDto[]> {
    return this.http
      .get<{ items: ImportMappingDto[] }>('/api/import-mappings')
      .pipe(map((body) => body.items));
  }

  /** POST /api/import-mappings: saves a mapping under a name for files with these headers. */
  save(input: SaveImportMappingInput): Observable<ImportMappingDto> {
    return this.http.post<ImportMappingDto>('/api/import-mappings', input);
  }

  /** DELETE /api/import-mappings/:id. */
  remove(id: number): Observable<void> {
    return this.http.delete<void>(`/api/import-mappings/${id}`);
  }
}
