import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidationErrors,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { Role } from '@shared/contracts/roles';
import type { Invitation } from '@shared/contracts/team';
import { apiErrorMessage } from '../../core/api/api-error';
import { TeamApi } from '../../core/api/team-api';
import { ROLE_LABELS, ROLE_ORDER } from '../../core/layout/role-labels';

/** One checkbox per role. */
type RoleControls = { [R in Role]: FormControl<boolean> };

/** The invitation form's controls. */
interface InviteForm {
  email: FormControl<string>;
  name: FormControl<string>;
  roles: FormGroup<RoleControls>;
}

/** Group validator: at least one role box is ticked. */
function atLeastOneRole(group: AbstractControl): ValidationErrors | null {
  const values = Object.values(group.value as Record<string, boolean>);
  return values.some(Boolean) ? null : { noRole: true };
}

/**
 * Dialog that invites a person by e-mail. It sends the request itself, so a refusal (already a
 * member, already invited) is shown where the address was typed; it closes with the invitation.
 */
@Component({
  selector: 'app-invite-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatCheckboxModule,
    MatButtonModule,
  ],
  templateUrl: './invite-dialog.html',
  styleUrl: './invite-dialog.scss',
})
export class InviteDialog {
  private readonly api = inject(TeamApi);
  private readonly dialogRef = inject<MatDialogRef<InviteDialog, Invitation>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);

  /** Every role with its display name. */
  protected readonly roleOptions = ROLE_ORDER.map((role) => ({ role, label: ROLE_LABELS[role] }));

  /** The form; no role is pre-ticked, so every grant is a deliberate choice. */
  protected readonly form = new FormGroup<InviteForm>({
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.email, Validators.maxLength(254)],
    }),
    name: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(120)] }),
    roles: new FormGroup<RoleControls>(
      {
        admin: new FormControl(false, { nonNullable: true }),
        tuner: new FormControl(false, { nonNullable: true }),
        operator: new FormControl(false, { nonNullable: true }),
        reviewer: new FormControl(false, { nonNullable: true }),
      },
      { validators: atLeastOneRole },
    ),
  });

  /** Why the last attempt failed, if it did. */
  protected readonly errorMessage = signal<string | null>(null);

  /** Whether the request is on its way. */
  protected readonly isSubmitting = signal(false);

  /** Sends the invitation and closes the dialog with it. */
  protected send(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, name, roles } = this.form.getRawValue();
    const trimmedName = name.trim();
    this.isSubmitting.set(true);
    this.errorMessage.set(null);
    this.api
      .invite({
        email: email.trim(),
        ...(trimmedName === '' ? {} : { name: trimmedName }),
        roles: ROLE_ORDER.filter((role) => roles[role]),
      })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (invitation) => this.dialogRef.close(invitation),
        error: (error: unknown) => {
          this.isSubmitting.set(false);
          this.errorMessage.set(apiErrorMessage(error, 'The invitation could not be sent.'));
        },
      });
  }
}
