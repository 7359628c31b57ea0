import { HttpClient, type HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ListResponse } from '@shared/contracts/errors';
import type { LogKind, LogResource, UploadLogResponse } from '@shared/contracts/logs';

/** What an upload sends beside the file itself. */
export interface LogUploadFields {
  /** Road drive or dyno session. */
  kind: LogKind;
  /** The column mapping as JSON text; absent to use the shop's preset or a suggestion. */
  mapping?: string;
  /** The revision the ECU ran while the log was recorded. */
  ecuRevisionId?: string;
}

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
}
