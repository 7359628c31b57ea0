import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ListResponse } from '@shared/contracts/errors';
import type { LogResource } from '@shared/contracts/logs';

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
}
