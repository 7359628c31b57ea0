import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type {
  AnalysisCell,
  AnalysisSamples,
  AnalysisSummary,
  ApplyAnalysisRequest,
  CreateAnalysisRequest,
} from '@shared/contracts/analyses';
import type { ListResponse } from '@shared/contracts/errors';
import type { AppliedGuard, Revision } from '@shared/contracts/tables';

export type { AnalysisCell, AnalysisSamples, AnalysisSummary } from '@shared/contracts/analyses';

/**
 * The fuel-safety guard an apply of an analysis runs with by default: the vehicle's load line
 * (a share of the barometric pressure the logs were recorded at) and lean allowance.
 */
export type AnalysisGuard = AppliedGuard;

/** The barometric pressure an analysis found in its logs, and where it came from. */
export interface AnalysisBaro {
  /** Barometric pressure, kPa absolute. */
  kpa: number;
  /** The logs' barometer, MAP with the engine off, or assumed (standard sea-level pressure). */
  source: AppliedGuard['baroSource'];
}

/** Paging of `GET /api/tables/:id/analyses`; absent fields take the server's defaults. */
export interface AnalysisListQuery {
  /** Page size, 1–100 (server default 20). */
  limit?: number;
  /** How many of the newest to skip. */
  offset?: number;
}

/** One line of a log's filter funnel. */
export interface FunnelLine {
  /** The rule's kind. */
  rule: string;
  /** The rule in words, with its limits. */
  label: string;
  /** `skipped` when the log lacks a channel the rule needs. */
  status: 'applied' | 'skipped';
  /** Samples this rule removed. */
  removed: number;
  /** Samples still kept after it. */
  remaining: number;
}

/** What one log contributed to an analysis. */
export interface LogFilterReport {
  /** The log. */
  logId: string;
  /** Samples in the log. */
  samples: number;
  /** Samples kept by the filters. */
  kept: number;
  /** The filter funnel, rule by rule. */
  funnel: FunnelLine[];
  /** The wideband delay applied. */
  delayUsed: { tau0S: number; kGrams: number; source: 'estimate' | 'settings' };
}

/** A cell measured leaner than commanded under load. */
export interface LeanFlag {
  /** Row (MAP breakpoint index). */
  row: number;
  /** Column (RPM breakpoint index). */
  col: number;
  /** The cell's RPM breakpoint. */
  rpm: number;
  /** The cell's MAP breakpoint, kPa. */
  mapKpa: number;
  /** Weighted mean lean error, %. */
  leanPercent: number;
  /** Worst single lean excursion, % (null when no sample under load touched it). */
  worstLeanPercent: number | null;
  /** The cell's weight: how much data the flag rests on. */
  weight: number;
  /**
   * `abort` ("stop": stop loading the engine there until it is richer), `warn` ("warning":
   * richen it before the next full-load run), both on a cell with the weight a proposal trusts;
   * `watch`: as lean, but on too little data to act on (log the cell again).
   */
  severity: LeanSeverity;
}

/** How loudly a lean flag is shown; see `LeanFlag.severity`. */
export type LeanSeverity = 'watch' | 'warn' | 'abort';

/** An analysis as `POST /api/tables/:id/analyses` and `GET /api/analyses/:id` answer it. */
export interface AnalysisResource {
  /** The analysis id. */
  id: string;
  /** Its table. */
  tableId: string;
  /** The revision the proposal starts from. */
  baseRevisionId: string;
  /** The logs analysed. */
  logIds: string[];
  /** Per-cell results `[row][col]`. */
  cells: AnalysisCell[][];
  /** Proposed VE `[row][col]`. */
  proposal: (number | null)[][];
  /** Per log: samples, kept, funnel and delay used. */
  filterReport: {
    logs: LogFilterReport[];
    samplesUsed?: number;
    cellsTrusted?: number;
    /** The barometric pressure behind the guard's load line (absent on older analyses). */
    baro?: AnalysisBaro;
  };
  /** Cells measured leaner than commanded under load: stop, then warning, then watch. */
  leanFlags: LeanFlag[];
  /** The fuel-safety guard an apply uses unless the user turns it off (`guard: false`). */
  guard: AnalysisGuard;
  /** When it ran. */
  createdAt: string;
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
