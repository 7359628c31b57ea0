import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type { Role } from '@shared/contracts/roles';
import type { CapturedMail, Invitation, Member, UpdateMemberRequest } from '@shared/contracts/team';
import type { Observable } from 'rxjs';
import { MetaApi } from '../../core/api/meta-api';
import { TeamApi } from '../../core/api/team-api';
import { Notifier } from '../../core/notify/notifier';

/**
 * State of the team page: members, invitations and, on a development server, captured mail.
 * Provided by the page, so it lives and dies with it. Failures are told by snackbar with the
 * server's own message.
 */
@Injectable()
export class TeamStore {
  private readonly api = inject(TeamApi);
  private readonly metaApi = inject(MetaApi);
  private readonly notifier = inject(Notifier);
  private readonly destroyRef = inject(DestroyRef);

  private readonly memberList = signal<Member[]>([]);
  private readonly invitationList = signal<Invitation[]>([]);
  private readonly mailList = signal<CapturedMail[]>([]);
  private readonly isMailCaptured = signal(false);
  private readonly isLoadingMembers = signal(true);

  /** The shop's members. */
  readonly members = this.memberList.asReadonly();
  /** Invitations in every state, as the server lists them. */
  readonly invitations = this.invitationList.asReadonly();
  /** Mail the development server caught instead of sending. */
  readonly mail = this.mailList.asReadonly();
  /** Whether the server catches outgoing mail (development only). */
  readonly mailCapture = this.isMailCaptured.asReadonly();
  /** Whether the first member list is still on its way. */
  readonly loadingMembers = this.isLoadingMembers.asReadonly();

  /** Loads everything the page shows. */
  load(): void {
    this.loadMembers();
    this.loadInvitations();
    this.run(this.metaApi.meta(), 'The server settings could not be loaded.', (meta) => {
      this.isMailCaptured.set(meta.mailCapture);
      if (meta.mailCapture) this.loadMail();
    });
  }

  /** Gives `member` exactly `roles`; an empty choice is refused here, before the server. */
  updateRoles(member: Member, roles: Role[]): void {
    if (roles.length === 0) {
      this.notifier.news('A member needs at least one role.');
      this.restore(member);
      return;
    }
    this.updateMember(member, { roles });
  }

  /** Disables or re-enables `member`; `onFailure` lets the caller put its control back. */
  setDisabled(member: Member, disabled: boolean, onFailure: () => void): void {
    this.updateMember(member, { disabled }, onFailure);
  }

  /** Revokes a pending invitation, then reloads the list. */
  revoke(invitation: Invitation): void {
    this.run(this.api.revokeInvitation(invitation.id), 'Revoking failed.', () => {
      this.notifier.news(`Invitation for ${invitation.email} revoked.`);
      this.loadInvitations();
    });
  }

  /** Called after the invite dialog created an invitation. */
  invitationCreated(invitation: Invitation): void {
    this.notifier.news(`Invitation sent to ${invitation.email}.`);
    this.loadInvitations();
    if (this.isMailCaptured()) this.loadMail();
  }

  /** Reloads the captured mail. */
  loadMail(): void {
    this.run(this.api.capturedMail(), 'Captured mail could not be loaded.', (list) =>
      this.mailList.set(list.items),
    );
  }

  private loadMembers(): void {
    this.run(
      this.api.members(),
      'Members could not be loaded.',
      (list) => {
        this.memberList.set(list.items);
        this.isLoadingMembers.set(false);
      },
      () => this.isLoadingMembers.set(false),
    );
  }

  private loadInvitations(): void {
    this.run(this.api.invitations(), 'Invitations could not be loaded.', (list) =>
      this.invitationList.set(list.items),
    );
  }

  private updateMember(member: Member, body: UpdateMemberRequest, onFailure?: () => void): void {
    this.run(
      this.api.updateMember(member.id, body),
      'Saving the member failed.',
      (updated) => this.replace(updated),
      () => {
        this.restore(member);
        onFailure?.();
      },
    );
  }

  /** Puts back the last saved state of `member`; fresh arrays make bound controls re-read it. */
  private restore(member: Member): void {
    const saved = this.memberList().find((each) => each.id === member.id) ?? member;
    this.replace({ ...saved, roles: [...saved.roles] });
  }

  private replace(member: Member): void {
    this.memberList.update((list) => list.map((each) => (each.id === member.id ? member : each)));
  }

  private run<T>(
    request: Observable<T>,
    fallback: string,
    onSuccess: (value: T) => void,
    onFailure?: () => void,
  ): void {
    request.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: onSuccess,
      error: (error: unknown) => {
        this.notifier.requestFailed(error, fallback);
        onFailure?.();
      },
    });
  }
}
