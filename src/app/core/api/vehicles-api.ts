import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ListResponse } from '@shared/contracts/errors';
import type { Vehicle } from '@shared/contracts/vehicles';

/** HTTP client of the shop's vehicles. */
@Injectable({ providedIn: 'root' })
export class VehiclesApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/vehicles`, sorted by label. */
  list(): Observable<ListResponse<Vehicle>> {
    return this.http.get<ListResponse<Vehicle>>('/api/vehicles', {
      params: { sort: 'label', order: 'asc', limit: 100 },
    });
  }
}
