import {
  HttpClient,
  HttpParams,
  type HttpEvent,
  type HttpParameterCodec,
} from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { map, type Observable } from 'rxjs';
import type { ListResponse } from '@shared/contracts/errors';
import type {
  LogKind,
  LogResource,
  LogSeries,
  MappingPreset,
  UpdateLogRequest,
  UploadLogResponse,
} from '@shared/contracts/logs';

/** What an upload sends beside the file itself. */
export interface LogUploadFields {
  /** Road drive or dyno session. */
  kind: LogKind;
  /** The column mapping as JSON text; absent to use the shop's preset or a suggestion. */
  mapping?: string;
  /** The revision the ECU ran while the log was recorded. */
  ecuRevisionId?: string;
}

/** Which part of a log's series to ask for; absent fields take the server's defaults. */
export interface LogSeriesWindow {
  /** Most buckets, 100–5000 (server default 1500). */
  points?: number;
  /** Start of the window, s. */
  fromS?: number;
  /** End of the window, s. */
  toS?: number;
}

/**
 * Encodes query values fully. Angular's default codec leaves `+` as it is, which servers read
 * as a space, and a column name may hold a `+`.
 */
const STRICT_QUERY_CODEC: HttpParameterCodec = {
  encodeKey: (key) => encodeURIComponent(key),
  encodeValue: (value) => encodeURIComponent(value),
  decodeKey: (key) => decodeURIComponent(key),
  decodeValue: (value) => decodeURIComponent(value),
};

/** HTTP client of the logs recorded on vehicles. */
@Injectable({ providedIn: 'root' })
export class LogsApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/vehicles/:id/logs`, newest first. */
  listForVehicle(vehicleId: string): Observable<ListResponse<LogResource>> {
    return this.http.get<ListResponse<LogResource>>(
      `/api/vehicles/${encodeURIComponent(vehicleId)}/logs`,
    );
  }

  /** `PATCH /api/logs/:id` (tuner, operator): the log's kind and the revision its ECU ran. */
  change(id: string, body: UpdateLogRequest): Observable<LogResource> {
    return this.http.patch<LogResource>(`/api/logs/${encodeURIComponent(id)}`, body);
  }

  /** `DELETE /api/logs/:id` (tuner, admin): the log, its channels and its stored file. */
  remove(id: string): Observable<void> {
    return this.http.delete<void>(`/api/logs/${encodeURIComponent(id)}`);
  }

  /** `GET /api/logs/:id`: the log with its parse state, channel summary and parse report. */
  get(id: string): Observable<LogResource> {
    return this.http.get<LogResource>(`/api/logs/${encodeURIComponent(id)}`);
  }

  /**
   * `POST /api/vehicles/:id/logs` (tuner, operator) as multipart, reporting upload progress.
   * The last event is the 202 answer; refusals (400, 409, 413, 422) arrive as errors.
   */
  upload(
    vehicleId: string,
    file: File,
    fields: LogUploadFields,
  ): Observable<HttpEvent<UploadLogResponse>> {
    const body = new FormData();
    body.append('kind', fields.kind);
    if (fields.mapping !== undefined) body.append('mapping', fields.mapping);
    if (fields.ecuRevisionId !== undefined) body.append('ecuRevisionId', fields.ecuRevisionId);
    body.append('file', file, file.name);
    return this.http.post<UploadLogResponse>(
      `/api/vehicles/${encodeURIComponent(vehicleId)}/logs`,
      body,
      { reportProgress: true, observe: 'events' },
    );
  }

  /**
   * `GET /api/logs/:id/series`: the log (or a window of it) bucketed for a chart, with the share
   * of each bucket the default filter keeps, its funnel and the delay used.
   */
  series(id: string, window: LogSeriesWindow = {}): Observable<LogSeries> {
    const params: Record<string, number> = {};
    for (const [key, value] of Object.entries(window)) {
      if (value !== undefined) params[key] = value;
    }
    return this.http.get<LogSeries>(`/api/logs/${encodeURIComponent(id)}/series`, { params });
  }

  /**
   * The shop's saved mapping for a header signature (as `headerSignature` of shared/import makes
   * it), or null when the shop has none. Asked through `GET /api/mapping-presets?signature=`,
   * whose answer is a list of none or one: "no preset" is an ordinary answer during an upload,
   * not an error for the browser to log.
   */
  findMappingPreset(signature: string): Observable<MappingPreset | null> {
    return this.http
      .get<ListResponse<MappingPreset>>('/api/mapping-presets', {
        params: new HttpParams({ encoder: STRICT_QUERY_CODEC, fromObject: { signature } }),
      })
      .pipe(map((res) => res.items[0] ?? null));
  }
}
