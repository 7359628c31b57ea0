import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ListResponse } from '@shared/contracts/errors';
import type {
  CreateVehicleInput,
  ListVehiclesQuery,
  UpdateVehicleRequest,
  Vehicle,
} from '@shared/contracts/vehicles';

/** A field the vehicle list can be sorted by. */
export type VehicleSort = ListVehiclesQuery['sort'];

/** Query of `GET /api/vehicles` as the client sends it; absent fields take the server's defaults. */
export interface VehicleListQuery {
  /** Search text in label and description (any case). */
  q?: string;
  /** Field to sort by. */
  sort?: VehicleSort;
  /** Sort direction. */
  order?: 'asc' | 'desc';
  /** Page size, 1–100. */
  limit?: number;
  /** How many matches to skip. */
  offset?: number;
}

/** HTTP client of the shop's vehicles, and of the tables, logs and revisions listed under them. */
@Injectable({ providedIn: 'root' })
export class VehiclesApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/vehicles`: one page of the matches and how many match in all. */
  list(query: VehicleListQuery = {}): Observable<ListResponse<Vehicle>> {
    const params: Record<string, string | number> = {};
    for (const [key, value] of Object.entries(query)) {
      if (value !== undefined) params[key] = value as string | number;
    }
    return this.http.get<ListResponse<Vehicle>>('/api/vehicles', { params });
  }

  /** `GET /api/vehicles/:id`: 404 when it is not in the shop. */
  get(id: string): Observable<Vehicle> {
    return this.http.get<Vehicle>(`/api/vehicles/${encodeURIComponent(id)}`);
  }

  /** `POST /api/vehicles` (tuner, admin): 400 names the refused field. */
  create(body: CreateVehicleInput): Observable<Vehicle> {
    return this.http.post<Vehicle>('/api/vehicles', body);
  }

  /** `PATCH /api/vehicles/:id` (tuner, admin): any subset of the creation body. */
  update(id: string, body: UpdateVehicleRequest): Observable<Vehicle> {
    return this.http.patch<Vehicle>(`/api/vehicles/${encodeURIComponent(id)}`, body);
  }
}
