import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  RescoringListDto,
  RescoringRunDto,
  RescoringScheduleDto,
  RescoringScheduleInput,
  ResumeRescoringInput,
  StartRescoringInput,
} from '@keelson/contracts';
import type { Observable } from 'rxjs';

const BASE = '/api/rescoring';

/**
 * Data access for the quarterly re-scoring: the list, starting one (once per quarter unless an
 * admin forces another), resuming or restarting an interrupted one, cancelling, and the
 * schedule an admin edits.
 */
@Injectable({ providedIn: 'root' })
export class RescoringApi {
  private readonly http = inject(HttpClient);

  /** GET /api/rescoring: the re-scorings, newest first. */
  list(limit = 50, offset = 0): Observable<RescoringListDto> {
    const params = new HttpParams().set('limit', String(limit)).set('offset', String(offset));
    return this.http.get<RescoringListDto>(BASE, { params });
  }

  /** POST /api/rescoring: starts one; 409 `quarter_taken` when the quarter has one already. */
  start(input: StartRescoringInput): Observable<RescoringRunDto> {
    return this.http.post<RescoringRunDto>(BASE, input);
  }

  /** POST /api/rescoring/:id/resume: an interrupted one again (`resume`) or anew (`restart`). */
  resume(id: number, input: ResumeRescoringInput): Observable<RescoringRunDto> {
    return this.http.post<RescoringRunDto>(`${BASE}/${id}/resume`, input);
  }

  /** POST /api/rescoring/:id/cancel: stops a queued or running one. */
  cancel(id: number): Observable<unknown> {
    return this.http.post(`${BASE}/${id}/cancel`, {});
  }

  /** GET /api/rescoring/schedule: when it runs by itself. */
  schedule(): Observable<RescoringScheduleDto> {
    return this.http.get<RescoringScheduleDto>(`${BASE}/schedule`);
  }

  /** PUT /api/rescoring/schedule (admins): a new timetable. */
  saveSchedule(input: RescoringScheduleInput): Observable<RescoringScheduleDto> {
    return this.http.put<RescoringScheduleDto>(`${BASE}/schedule`, input);
  }
}
