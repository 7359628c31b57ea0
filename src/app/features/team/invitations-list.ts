import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatListModule } from '@angular/material/list';
import type { Invitation } from '@shared/contracts/team';
import { ROLE_LABELS } from '../../core/layout/role-labels';

/** Invitations with their state; pending ones can be revoked. */
@Component({
  selector: 'app-invitations-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatListModule, MatButtonModule],
  template: `
    @if (invitations().length === 0) {
      <p class="empty">No invitations.</p>
    } @else {
      <mat-list aria-label="Invitations">
        @for (invitation of invitations(); track invitation.id) {
          <mat-list-item>
            <span matListItemTitle>{{ invitation.email }}</span>
            <span matListItemLine>
              {{ roleText(invitation) }} · {{ invitation.status }}
              @if (invitation.status === 'pending') {
                · expires {{ invitation.expiresAt | date: 'medium' }}
              }
            </span>
            @if (invitation.status === 'pending') {
              <button matListItemMeta mat-button type="button" (click)="revoke.emit(invitation)">
                Revoke
              </button>
            }
          </mat-list-item>
        }
      </mat-list>
    }
  `,
  styles: `
    .empty {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class InvitationsList {
  /** The invitations to list. */
  readonly invitations = input.required<Invitation[]>();

  /** Emits the invitation whose "Revoke" button was pressed. */
  readonly revoke = output<Invitation>();

  /** The invited roles as display text. */
  protected roleText(invitation: Invitation): string {
    return invitation.roles.map((role) => ROLE_LABELS[role]).join(', ');
  }
}
