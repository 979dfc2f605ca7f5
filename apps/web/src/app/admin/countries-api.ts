import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CountryDto, UpdateCountryInput } from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** Data access for the country hazard table (everyone reads it; admins change it). */
@Injectable({ providedIn: 'root' })
export class CountriesApi {
  private readonly http = inject(HttpClient);

  /** GET /api/countries: every country with its hazard rating, in code order. */
  list(): Observable<CountryDto[]> {
    return this.http.get<CountryDto[]>('/api/countries');
  }

  /** PUT /api/countries/:code: sets the hazard (and optionally name and region); admin only. */
  update(code: string, input: UpdateCountryInput): Observable<CountryDto> {
    return this.http.put<CountryDto>(`/api/countries/${encodeURIComponent(code)}`, input);
  }
}
