import {
  HttpClient,
  type HttpEvent,
  HttpEventType,
  HttpParams,
  type HttpProgressEvent,
} from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  CheckImportInput,
  ImportBatchDto,
  ImportCommitDto,
  ImportLimitsDto,
  ImportProblemDto,
  ImportStatus,
  ListImportProblemsQuery,
  Page,
  WorkbookInspection,
} from '@keelson/contracts';
import { type Observable, filter, map } from 'rxjs';

/** Where an upload stands: bytes sent so far, or the batch the server made of the file. */
export type UploadState =
  | { kind: 'progress'; loaded: number; total: number | null }
  | { kind: 'done'; batch: ImportBatchDto };

/** A query for GET /api/imports; every field is optional. */
export interface BatchQuery {
  status?: ImportStatus;
  limit?: number;
  offset?: number;
}

/** A query for GET /api/imports/:id/problems; every field is optional. */
export type ProblemQuery = Partial<ListImportProblemsQuery>;

/** Turns a query object into URL parameters, leaving out empty values. */
export function queryParams(query: Record<string, string | number | undefined>): HttpParams {
  let params = new HttpParams();
  for (const [key, value] of Object.entries(query)) {
    const text = typeof value === 'string' ? value.trim() : value;
    if (text !== undefined && text !== '') {
      params = params.set(key, String(text));
    }
  }
  return params;
}

/** The state an upload event stands for, or null for events that say nothing new. */
function uploadState(event: HttpEvent<ImportBatchDto>): UploadState | null {
  if (event.type === HttpEventType.UploadProgress) {
    const progress = event as HttpProgressEvent;
    return { kind: 'progress', loaded: progress.loaded, total: progress.total ?? null };
  }
  if (event.type === HttpEventType.Response && event.body) {
    return { kind: 'done', batch: event.body };
  }
  return null;
}

/** Data access for import batches: upload, inspection, check, problems and commit. */
@Injectable({ providedIn: 'root' })
export class ImportsApi {
  private readonly http = inject(HttpClient);

  /**
   * POST /api/imports as multipart (`file`, and `mapping` for a saved mapping id), reporting
   * upload progress. Unsubscribing aborts the upload.
   */
  upload(file: File, mappingId?: number): Observable<UploadState> {
    const form = new FormData();
    form.append('file', file, file.name);
    if (mappingId !== undefined) {
      form.append('mapping', String(mappingId));
    }
    return this.http
      .post<ImportBatchDto>('/api/imports', form, { reportProgress: true, observe: 'events' })
      .pipe(
        map(uploadState),
        filter((state): state is UploadState => state !== null),
      );
  }

  /** GET /api/imports: one page of batches, newest first. */
  list(query: BatchQuery = {}): Observable<Page<ImportBatchDto>> {
    return this.http.get<Page<ImportBatchDto>>('/api/imports', {
      params: queryParams({ ...query }),
    });
  }

  /** GET /api/imports/:id: one batch. */
  get(id: number): Observable<ImportBatchDto> {
    return this.http.get<ImportBatchDto>(`/api/imports/${id}`);
  }

  /** GET /api/imports/:id/inspection: the file's sheets, headers and suggestions. */
  inspection(id: number, mappingId?: number): Observable<WorkbookInspection> {
    return this.http.get<WorkbookInspection>(`/api/imports/${id}/inspection`, {
      params: queryParams({ mappingId }),
    });
  }

  /** POST /api/imports/:id/check: reads the stored file again with a mapping. */
  check(id: number, input: CheckImportInput): Observable<ImportBatchDto> {
    return this.http.post<ImportBatchDto>(`/api/imports/${id}/check`, input);
  }

  /** GET /api/imports/:id/problems: one page of the batch's errors and warnings. */
  problems(id: number, query: ProblemQuery = {}): Observable<Page<ImportProblemDto>> {
    return this.http.get<Page<ImportProblemDto>>(`/api/imports/${id}/problems`, {
      params: queryParams({ ...query }),
    });
  }

  /** POST /api/imports/:id/commit: makes the batch the new network version. */
  commit(id: number): Observable<ImportCommitDto> {
    return this.http.post<ImportCommitDto>(`/api/imports/${id}/commit`, {});
  }

  /** Where the batch's error report (xlsx) downloads from. */
  errorReportUrl(id: number): string {
    return `/api/imports/${id}/error-report.xlsx`;
  }

  /** GET /api/imports/limits: the server's upload limit. */
  limits(): Observable<ImportLimitsDto> {
    return this.http.get<ImportLimitsDto>('/api/imports/limits');
  }

  /** Where the empty template (xlsx) downloads from. */
  templateUrl(): string {
    return '/api/imports/template.xlsx';
  }
}
