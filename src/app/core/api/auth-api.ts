import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { LoginRequest, SessionResponse } from '@shared/contracts/auth';

/** HTTP client of `/api/auth`: signing in and out, and the current session. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/auth/me`: the signed-in user, or a 401 answer. */
  me(): Observable<SessionResponse> {
    return this.http.get<SessionResponse>('/api/auth/me');
  }

  /** `POST /api/auth/login`: 401 on wrong credentials, 429 (with Retry-After) when throttled. */
  login(body: LoginRequest): Observable<SessionResponse> {
    return this.http.post<SessionResponse>('/api/auth/login', body);
  }

  /** `POST /api/auth/logout`: ends the session (204). */
  logout(): Observable<void> {
    return this.http.post<void>('/api/auth/logout', null);
  }
}
