import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  CreateRegisterEntryInput,
  ListRegisterQuery,
  OverrideLikelihoodInput,
  Page,
  RegisterEntryDetailDto,
  RegisterEntryDto,
  UpdateRegisterEntryInput,
} from '@keelson/contracts';
import { EMPTY, type Observable, expand, reduce } from 'rxjs';

/** A query for GET /api/register; every field is optional (the server has defaults). */
export type RegisterQuery = Partial<ListRegisterQuery>;

/** Rows per request when every matching entry is wanted (the API's largest page). */
export const REGISTER_BATCH_SIZE = 1000;

/** Turns a query into URL parameters, leaving out empty values. */
export function registerQueryParams(query: RegisterQuery): HttpParams {
  let params = new HttpParams();
  for (const [key, value] of Object.entries(query) as [string, unknown][]) {
    if (value === undefined || value === null || value === '') {
      continue;
    }
    params = params.set(key, String(value));
  }
  return params;
}

/** Data access for the risk register (everyone reads; risk managers and admins write). */
@Injectable({ providedIn: 'root' })
export class RegisterApi {
  private readonly http = inject(HttpClient);

  /** GET /api/register: one page of entries matching the query. */
  list(query: RegisterQuery = {}): Observable<Page<RegisterEntryDto>> {
    return this.http.get<Page<RegisterEntryDto>>('/api/register', {
      params: registerQueryParams(query),
    });
  }

  /**
   * Every entry matching the query, read in pages of {@link REGISTER_BATCH_SIZE} one after the
   * other (for the print layout). Stops at the total, or early if a page comes back empty.
   */
  listAll(query: RegisterQuery = {}): Observable<RegisterEntryDto[]> {
    const { limit: _limit, offset: _offset, ...filters } = query;
    const pageAt = (offset: number) =>
      this.list({ ...filters, limit: REGISTER_BATCH_SIZE, offset });
    return pageAt(0).pipe(
      expand((page, index) => {
        const read = (index + 1) * REGISTER_BATCH_SIZE;
        return read < page.total && page.items.length === REGISTER_BATCH_SIZE
          ? pageAt(read)
          : EMPTY;
      }),
      reduce((all, page) => all.concat(page.items), [] as RegisterEntryDto[]),
    );
  }

  /** GET /api/register/:id: one entry with its likelihood overrides. */
  get(id: number): Observable<RegisterEntryDetailDto> {
    return this.http.get<RegisterEntryDetailDto>(`/api/register/${id}`);
  }

  /** POST /api/register: an entry made by hand. */
  create(input: CreateRegisterEntryInput): Observable<RegisterEntryDto> {
    return this.http.post<RegisterEntryDto>('/api/register', input);
  }

  /** PATCH /api/register/:id: title, owner, status or notes. */
  update(id: number, input: UpdateRegisterEntryInput): Observable<RegisterEntryDto> {
    return this.http.patch<RegisterEntryDto>(`/api/register/${id}`, input);
  }

  /** POST /api/register/:id/likelihood: overrides the likelihood (or removes it) with a reason. */
  overrideLikelihood(id: number, input: OverrideLikelihoodInput): Observable<unknown> {
    return this.http.post<unknown>(`/api/register/${id}/likelihood`, input);
  }

  /**
   * Where the register's workbook downloads from, with the same filters and sort as the table.
   * A plain link is enough: the browser sends the session cookie with a GET.
   */
  exportUrl(query: RegisterQuery = {}): string {
    const { limit: _limit, offset: _offset, ...filters } = query;
    const params = registerQueryParams(filters).toString();
    return params ? `/api/register/export.xlsx?${params}` : '/api/register/export.xlsx';
  }
}
