import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatSelectModule } from '@angular/material/select';
import { type MatSlideToggleChange, MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTableModule } from '@angular/material/table';
import type { Role } from '@shared/contracts/roles';
import type { Member } from '@shared/contracts/team';
import { ROLE_LABELS, ROLE_ORDER } from '../../core/layout/role-labels';

/** A member's new roles, as chosen in the table. */
export interface RolesChange {
  /** The member as the table showed it. */
  member: Member;
  /** The roles now selected (possibly none; the store refuses that). */
  roles: Role[];
}

/** A member being disabled or re-enabled. */
export interface DisabledChange {
  /** The member as the table showed it. */
  member: Member;
  /** Whether the member should be disabled. */
  disabled: boolean;
  /** Puts the toggle back when the change fails. */
  revert: () => void;
}

/** The shop's members with their roles and access, editable in place. */
@Component({
  selector: 'app-members-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatTableModule, MatSelectModule, MatSlideToggleModule],
  templateUrl: './members-table.html',
  styleUrl: './members-table.scss',
})
export class MembersTable {
  /** The members to list. */
  readonly members = input.required<Member[]>();

  /** Emits when a member's roles are changed. */
  readonly rolesChange = output<RolesChange>();

  /** Emits when a member is disabled or re-enabled. */
  readonly disabledChange = output<DisabledChange>();

  /** Column order. */
  protected readonly columns = ['name', 'email', 'roles', 'disabled', 'joinedAt'];

  /** Every role with its display name. */
  protected readonly roleOptions = ROLE_ORDER.map((role) => ({ role, label: ROLE_LABELS[role] }));

  /** Keeps rows (and open selects) in place when one member is replaced by the server's copy. */
  protected readonly trackById = (_index: number, member: Member): string => member.id;

  /** Forwards a roles selection. */
  protected changeRoles(member: Member, roles: Role[]): void {
    this.rolesChange.emit({ member, roles });
  }

  /** Forwards a disabled toggle. */
  protected changeDisabled(member: Member, change: MatSlideToggleChange): void {
    this.disabledChange.emit({
      member,
      disabled: change.checked,
      revert: () => {
        change.source.checked = !change.checked;
      },
    });
  }
}
