import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';

/** Answer of `GET /api/meta`: facts about this server that change what the UI offers. */
export interface ServerMeta {
  /** Whether outgoing mail is caught by the development mail catcher instead of being sent. */
  mailCapture: boolean;
  /** The server's version string. */
  version: string;
}

/** HTTP client of `/api/meta`. */
@Injectable({ providedIn: 'root' })
export class MetaApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/meta`. */
  meta(): Observable<ServerMeta> {
    return this.http.get<ServerMeta>('/api/meta');
  }
}
