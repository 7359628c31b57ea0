import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ListResponse } from '@shared/contracts/errors';
import type {
  CapturedMail,
  CreateInvitationRequest,
  Invitation,
  Member,
  UpdateMemberRequest,
} from '@shared/contracts/team';

/** HTTP client of the shop's team: members, invitations and (in development) captured mail. */
@Injectable({ providedIn: 'root' })
export class TeamApi {
  private readonly http = inject(HttpClient);

  /** `GET /api/team/members`. */
  members(): Observable<ListResponse<Member>> {
    return this.http.get<ListResponse<Member>>('/api/team/members');
  }

  /** `PATCH /api/team/members/:id`: 409 when an admin would lock themself out. */
  updateMember(id: string, body: UpdateMemberRequest): Observable<Member> {
    return this.http.patch<Member>(`/api/team/members/${encodeURIComponent(id)}`, body);
  }

  /** `GET /api/team/invitations`. */
  invitations(): Observable<ListResponse<Invitation>> {
    return this.http.get<ListResponse<Invitation>>('/api/team/invitations');
  }

  /** `POST /api/team/invitations`: 409 when the address is a member or already invited. */
  invite(body: CreateInvitationRequest): Observable<Invitation> {
    return this.http.post<Invitation>('/api/team/invitations', body);
  }

  /** `DELETE /api/team/invitations/:id`. */
  revokeInvitation(id: string): Observable<void> {
    return this.http.delete<void>(`/api/team/invitations/${encodeURIComponent(id)}`);
  }

  /** `GET /api/dev/mail`: only answers while the server captures mail. */
  capturedMail(): Observable<ListResponse<CapturedMail>> {
    return this.http.get<ListResponse<CapturedMail>>('/api/dev/mail');
  }
}
