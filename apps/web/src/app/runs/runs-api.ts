import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  AnalysisRunDto,
  HeatMapDto,
  ListRunSuppliersQuery,
  Page,
  ParetoDto,
  RunSupplierDto,
  StartRunInput,
} from '@keelson/contracts';
import type { ScoringSettings } from '@keelson/scoring';
import type { Observable } from 'rxjs';
import { browseParams } from '../network/network-browse-api';

/** A query of the ranking; the server fills in what is left out. */
export type RunSupplierQuery = Partial<ListRunSuppliersQuery>;

const BASE = '/api/analysis-runs';

/**
 * Data access for analysis runs and their results: the list, one run, starting and cancelling,
 * the ranking, the heat map, the Pareto data and the scoring settings the bands come from.
 * Plant managers get only rows touching their plants from the server.
 */
@Injectable({ providedIn: 'root' })
export class RunsApi {
  private readonly http = inject(HttpClient);

  /** GET /api/analysis-runs: one page of runs, newest first. */
  list(limit = 25, offset = 0, networkVersionId?: number): Observable<Page<AnalysisRunDto>> {
    return this.http.get<Page<AnalysisRunDto>>(BASE, {
      params: browseParams({ limit, offset, networkVersionId }),
    });
  }

  /** GET /api/analysis-runs/:id: one run with its status, progress and totals. */
  get(id: number): Observable<AnalysisRunDto> {
    return this.http.get<AnalysisRunDto>(`${BASE}/${id}`);
  }

  /** POST /api/analysis-runs: queues a run (the server answers 202 with its id). */
  start(input: StartRunInput): Observable<{ id: number }> {
    return this.http.post<{ id: number }>(BASE, input);
  }

  /** POST /api/analysis-runs/:id/cancel: asks a queued or running run to stop. */
  cancel(id: number): Observable<unknown> {
    return this.http.post(`${BASE}/${id}/cancel`, {});
  }

  /** Where the server-sent progress events of a run come from. */
  eventsUrl(id: number): string {
    return `${BASE}/${id}/events`;
  }

  /** GET /api/analysis-runs/:id/suppliers: one page of the ranking. */
  suppliers(id: number, query: RunSupplierQuery = {}): Observable<Page<RunSupplierDto>> {
    return this.http.get<Page<RunSupplierDto>>(`${BASE}/${id}/suppliers`, {
      params: browseParams(query),
    });
  }

  /** GET /api/analysis-runs/:id/heat-map: suppliers per (likelihood, impact band) cell. */
  heatMap(id: number): Observable<HeatMapDto> {
    return this.http.get<HeatMapDto>(`${BASE}/${id}/heat-map`);
  }

  /** GET /api/analysis-runs/:id/pareto: suppliers by revenue impact with the running share. */
  pareto(id: number): Observable<ParetoDto> {
    return this.http.get<ParetoDto>(`${BASE}/${id}/pareto`);
  }

  /**
   * Where the ranking downloads as a workbook, with the screen's filters and sort (no paging:
   * every matching supplier the person may see). A plain link is enough: the browser sends the
   * session cookie with a GET.
   */
  exportUrl(id: number, query: RunSupplierQuery = {}): string {
    const { limit: _limit, offset: _offset, ...filters } = query;
    void _limit;
    void _offset;
    const params = browseParams(filters).toString();
    return `${BASE}/${id}/export.xlsx${params ? `?${params}` : ''}`;
  }

  /** GET /api/settings/scoring: the impact band limits and rating band floors in force. */
  scoringSettings(): Observable<ScoringSettings> {
    return this.http.get<ScoringSettings>('/api/settings/scoring');
  }
}

