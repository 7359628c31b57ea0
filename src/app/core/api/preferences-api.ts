import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type {
  DisplayPreferenceValues,
  UpdateDisplayPreferencesRequest,
} from '@shared/contracts/preferences';

/** HTTP client of `/api/me/preferences`: the signed-in user's display preferences. */
@Injectable({ providedIn: 'root' })
export class PreferencesApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/me/preferences`: all of them (defaults for a user who never chose). */
  get(): Observable<DisplayPreferenceValues> {
    return this.http.get<DisplayPreferenceValues>('/api/me/preferences');
  }

  /** `PATCH /api/me/preferences`: changes the fields given, answers all of them. */
  update(change: UpdateDisplayPreferencesRequest): Observable<DisplayPreferenceValues> {
    return this.http.patch<DisplayPreferenceValues>('/api/me/preferences', change);
  }
}
