import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AnalysisRunDto, Page, RunSupplierDetailDto } from '@keelson/contracts';
import type { Observable } from 'rxjs';
import type { NetworkPicture } from './network-picture-dto';

/**
 * Data access for the risk screens: one supplier's result in a run, the runs of a version (to
 * pick one for the picture) and the network picture. The server scopes all of it to a plant
 * manager's plants.
 */
@Injectable({ providedIn: 'root' })
export class RiskApi {
  private readonly http = inject(HttpClient);

  /** GET /api/analysis-runs/:runId/suppliers/:code: the supplier's row, paths and history. */
  supplierDetail(runId: number, code: string): Observable<RunSupplierDetailDto> {
    return this.http.get<RunSupplierDetailDto>(
      `/api/analysis-runs/${runId}/suppliers/${encodeURIComponent(code)}`,
    );
  }

  /** GET /api/analysis-runs?networkVersionId=: the newest runs of a version. */
  runsOfVersion(networkVersionId: number, limit = 50): Observable<Page<AnalysisRunDto>> {
    const params = new HttpParams()
      .set('networkVersionId', String(networkVersionId))
      .set('limit', String(limit));
    return this.http.get<Page<AnalysisRunDto>>('/api/analysis-runs', { params });
  }

  /** GET /api/network-versions/:id/picture, with a run's single points marked when given. */
  picture(networkVersionId: number, runId: number | null): Observable<NetworkPicture> {
    const params = runId === null ? new HttpParams() : new HttpParams().set('runId', runId);
    return this.http.get<NetworkPicture>(`/api/network-versions/${networkVersionId}/picture`, {
      params,
    });
  }
}
