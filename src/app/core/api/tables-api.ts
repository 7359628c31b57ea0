import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ListResponse } from '@shared/contracts/errors';
import type {
  CreateRevisionRequest,
  CreateTableRequest,
  Revision,
  RevisionSummary,
  VeTableResource,
} from '@shared/contracts/tables';

/** HTTP client of VE tables and their revisions. */
@Injectable({ providedIn: 'root' })
export class TablesApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/vehicles/:id/tables`, oldest first. */
  listForVehicle(vehicleId: string): Observable<ListResponse<VeTableResource>> {
    return this.http.get<ListResponse<VeTableResource>>(
      `/api/vehicles/${encodeURIComponent(vehicleId)}/tables`,
    );
  }

  /** `POST /api/vehicles/:id/tables`: a new table whose first revision holds `values`. */
  create(vehicleId: string, body: CreateTableRequest): Observable<VeTableResource> {
    return this.http.post<VeTableResource>(
      `/api/vehicles/${encodeURIComponent(vehicleId)}/tables`,
      body,
    );
  }

  /** `GET /api/tables/:id`. */
  get(tableId: string): Observable<VeTableResource> {
    return this.http.get<VeTableResource>(`/api/tables/${encodeURIComponent(tableId)}`);
  }

  /** `GET /api/tables/:id/revisions`, by number ascending, without values. */
  revisions(tableId: string): Observable<ListResponse<RevisionSummary>> {
    return this.http.get<ListResponse<RevisionSummary>>(
      `/api/tables/${encodeURIComponent(tableId)}/revisions`,
    );
  }

  /** `GET /api/revisions/:id`, with its values. */
  revision(revisionId: string): Observable<Revision> {
    return this.http.get<Revision>(`/api/revisions/${encodeURIComponent(revisionId)}`);
  }

  /** `POST /api/tables/:id/revisions`: a new draft that becomes the table's head. */
  createRevision(tableId: string, body: CreateRevisionRequest): Observable<Revision> {
    return this.http.post<Revision>(`/api/tables/${encodeURIComponent(tableId)}/revisions`, body);
  }
}
