import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { AcceptInvitationRequest, InvitationPreview, Member } from '@shared/contracts/team';

/** HTTP client of the public invitation pages (`/api/invitations/:token`). */
@Injectable({ providedIn: 'root' })
export class InvitationsApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/invitations/:token`: 404 when the invitation is unknown, used or expired. */
  preview(token: string): Observable<InvitationPreview> {
    return this.http.get<InvitationPreview>(`/api/invitations/${encodeURIComponent(token)}`);
  }

  /** `POST /api/invitations/:token/accept`: creates the member (201). */
  accept(token: string, body: AcceptInvitationRequest): Observable<Member> {
    return this.http.post<Member>(`/api/invitations/${encodeURIComponent(token)}/accept`, body);
  }
}
