import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { EntryScoreDto, RescoringTrendsDto, RunComparisonDto } from '@keelson/contracts';
import type { Observable } from 'rxjs';

const BASE = '/api/comparison';

/** The two runs of a comparison; left out, the server picks the last two quarterly runs. */
export interface ComparedRuns {
  from?: number | null;
  to?: number | null;
}

function runParams({ from, to }: ComparedRuns): HttpParams {
  let params = new HttpParams();
  if (from) params = params.set('from', String(from));
  if (to) params = params.set('to', String(to));
  return params;
}

/**
 * Data access for what changed between two analysis runs, its workbook, the quarterly trends
 * and one register entry's score per quarter. The server scopes rows to a plant manager's
 * plants.
 */
@Injectable({ providedIn: 'root' })
export class ComparisonApi {
  private readonly http = inject(HttpClient);

  /** GET /api/comparison?from&to: new and gone single points, risers, fallers, added, removed. */
  compare(runs: ComparedRuns = {}): Observable<RunComparisonDto> {
    return this.http.get<RunComparisonDto>(BASE, { params: runParams(runs) });
  }

  /** Where the comparison downloads as a workbook (a plain link sends the session cookie). */
  exportUrl(runs: ComparedRuns): string {
    const query = runParams(runs).toString();
    return `${BASE}/export.xlsx${query ? `?${query}` : ''}`;
  }

  /** GET /api/comparison/trends: totals per quarter, oldest first. */
  trends(): Observable<RescoringTrendsDto> {
    return this.http.get<RescoringTrendsDto>(`${BASE}/trends`);
  }

  /** GET /api/comparison/entries/:entryId/scores: a register entry's score per re-scoring. */
  entryScores(entryId: number): Observable<EntryScoreDto[]> {
    return this.http.get<EntryScoreDto[]>(`${BASE}/entries/${entryId}/scores`);
  }
}
