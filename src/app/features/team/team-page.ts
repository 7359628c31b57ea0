import { ChangeDetectionStrategy, Component, type OnInit, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Invitation } from '@shared/contracts/team';
import { CapturedMail } from './captured-mail';
import { InvitationsList } from './invitations-list';
import { InviteDialog } from './invite-dialog';
import { type DisabledChange, MembersTable, type RolesChange } from './members-table';
import { TeamStore } from './team-store';

/** The admin's team page: members and their roles, invitations, and dev-captured mail. */
@Component({
  selector: 'app-team-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [TeamStore],
  imports: [
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MembersTable,
    InvitationsList,
    CapturedMail,
  ],
  templateUrl: './team-page.html',
  styleUrl: './team-page.scss',
})
export class TeamPage implements OnInit {
  private readonly dialog = inject(MatDialog);

  /** The page's state. */
  protected readonly store = inject(TeamStore);

  ngOnInit(): void {
    this.store.load();
  }

  /** Opens the invite dialog; a created invitation refreshes the lists. */
  protected openInviteDialog(): void {
    this.dialog
      .open<InviteDialog, void, Invitation>(InviteDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((invitation) => {
        if (invitation !== undefined) this.store.invitationCreated(invitation);
      });
  }

  /** Saves a member's new roles. */
  protected changeRoles(change: RolesChange): void {
    this.store.updateRoles(change.member, change.roles);
  }

  /** Disables or re-enables a member. */
  protected changeDisabled(change: DisabledChange): void {
    this.store.setDisabled(change.member, change.disabled, change.revert);
  }

  /** Revokes a pending invitation. */
  protected revoke(invitation: Invitation): void {
    this.store.revoke(invitation);
  }
}

export default TeamPage;
