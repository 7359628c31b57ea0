import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type {
  AnalysisResource,
  AnalysisSamples,
  AnalysisSummary,
  ApplyAnalysisRequest,
  CreateAnalysisRequest,
} from '@shared/contracts/analyses';
import type { ListResponse } from '@shared/contracts/errors';
import type { AppliedGuard, Revision } from '@shared/contracts/tables';

export type {
  AnalysisBaro,
  AnalysisCell,
  AnalysisResource,
  AnalysisSamples,
  AnalysisSummary,
  LeanFlag,
  LeanSeverity,
  LogFilterReport,
} from '@shared/contracts/analyses';
export type { FunnelLine } from '@shared/contracts/logs';

/**
 * The fuel-safety guard an apply of an analysis runs with by default: the vehicle's load line
 * (a share of the barometric pressure the logs were recorded at) and lean allowance.
 */
export type AnalysisGuard = AppliedGuard;

/** Paging of `GET /api/tables/:id/analyses`; absent fields take the server's defaults. */
export interface AnalysisListQuery {
  /** Page size, 1–100 (server default 20). */
  limit?: number;
  /** How many of the newest to skip. */
  offset?: number;
}

/**
 * HTTP client of analyses: running one over logs, listing a table's earlier ones, reading the
 * samples one kept, and applying one as a draft revision.
 */
@Injectable({ providedIn: 'root' })
export class AnalysesApi {
  private readonly http = inject(HttpClient);

  /** `POST /api/tables/:id/analyses`. */
  run(tableId: string, body: CreateAnalysisRequest): Observable<AnalysisResource> {
    return this.http.post<AnalysisResource>(
      `/api/tables/${encodeURIComponent(tableId)}/analyses`,
      body,
    );
  }

  /** `GET /api/tables/:id/analyses`: a page of the table's analyses, newest first, no grids. */
  listForTable(
    tableId: string,
    query: AnalysisListQuery = {},
  ): Observable<ListResponse<AnalysisSummary>> {
    const params: Record<string, number> = {};
    if (query.limit !== undefined) params['limit'] = query.limit;
    if (query.offset !== undefined) params['offset'] = query.offset;
    return this.http.get<ListResponse<AnalysisSummary>>(
      `/api/tables/${encodeURIComponent(tableId)}/analyses`,
      { params },
    );
  }

  /** `GET /api/analyses/:id`: one analysis with its cells and proposal. */
  get(analysisId: string): Observable<AnalysisResource> {
    return this.http.get<AnalysisResource>(`/api/analyses/${encodeURIComponent(analysisId)}`);
  }

  /**
   * `GET /api/analyses/:id/samples`: the samples the analysis kept, as columns, evenly thinned
   * to at most `max` (100–20000; server default 4000).
   */
  samples(analysisId: string, max?: number): Observable<AnalysisSamples> {
    const params: Record<string, number> = max === undefined ? {} : { max };
    return this.http.get<AnalysisSamples>(
      `/api/analyses/${encodeURIComponent(analysisId)}/samples`,
      { params },
    );
  }

  /**
   * `POST /api/analyses/:id/apply`: a new draft revision (parent: the analysis's base). The
   * body's `guard: false` turns the fuel-safety guard off, which the revision records.
   */
  apply(analysisId: string, body: ApplyAnalysisRequest): Observable<Revision> {
    return this.http.post<Revision>(`/api/analyses/${encodeURIComponent(analysisId)}/apply`, body);
  }
}
