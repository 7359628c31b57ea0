import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  type OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { Router, RouterLink } from '@angular/router';
import { MIN_PASSWORD_LENGTH } from '@shared/contracts/constants';
import type { InvitationPreview } from '@shared/contracts/team';
import { apiErrorMessage } from '../../core/api/api-error';
import { InvitationsApi } from '../../core/api/invitations-api';
import { ROLE_LABELS } from '../../core/layout/role-labels';
import { PASSWORD_MISMATCH, RepeatPasswordErrorMatcher, passwordsMatch } from './password-match';
import { Notifier } from '../../core/notify/notifier';

/** Sentence shown when the token is unknown, used, revoked or expired. */
const INVALID_INVITATION = 'This invitation is no longer valid';

/** The acceptance form's controls. */
interface AcceptForm {
  name: FormControl<string>;
  password: FormControl<string>;
  repeat: FormControl<string>;
}

/** The public page behind an invitation link: shows the invitation and creates the account. */
@Component({
  selector: 'app-invitation-page',
  templateUrl: './invitation-page.html',
  styleUrl: './invitation-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatProgressSpinnerModule,
  ],
})
export class InvitationPage implements OnInit {
  private readonly api = inject(InvitationsApi);
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  private readonly destroyRef = inject(DestroyRef);

  /** The `:token` route parameter. */
  readonly token = input.required<string>();

  /** The invitation, once loaded. */
  protected readonly preview = signal<InvitationPreview | null>(null);

  /** Why the invitation cannot be shown or accepted, if it cannot. */
  protected readonly loadError = signal<string | null>(null);

  /** The message of a failed acceptance that leaves the form usable. */
  protected readonly submitError = signal<string | null>(null);

  /** Whether the acceptance request is on its way. */
  protected readonly isSubmitting = signal(false);

  /** The invited roles as display text. */
  protected readonly roleText = computed(() =>
    (this.preview()?.roles ?? []).map((role) => ROLE_LABELS[role]).join(', '),
  );

  /** Shortest password, shown in the hint. */
  protected readonly minLength = MIN_PASSWORD_LENGTH;

  /** Puts the repeat field in error when the passwords differ. */
  protected readonly repeatMatcher = new RepeatPasswordErrorMatcher();

  /** The form. */
  protected readonly form = new FormGroup<AcceptForm>(
    {
      name: new FormControl('', {
        nonNullable: true,
        validators: [Validators.required, Validators.maxLength(120)],
      }),
      password: new FormControl('', {
        nonNullable: true,
        validators: [
          Validators.required,
          Validators.minLength(MIN_PASSWORD_LENGTH),
          Validators.maxLength(200),
        ],
      }),
      repeat: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    },
    { validators: passwordsMatch('password', 'repeat') },
  );

  /** The group error key, for the template. */
  protected readonly mismatch = PASSWORD_MISMATCH;

  ngOnInit(): void {
    this.loadPreview();
  }

  /** Creates the account, then sends the new member to sign in with their address filled in. */
  protected accept(): void {
    const preview = this.preview();
    if (preview === null) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, password } = this.form.getRawValue();
    this.isSubmitting.set(true);
    this.submitError.set(null);
    this.api
      .accept(this.token(), { name: name.trim(), password })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => {
          this.isSubmitting.set(false);
          this.notifier.news('Invitation accepted — sign in with your new password');
          void this.router.navigate(['/sign-in'], { queryParams: { email: preview.email } });
        },
        error: (error: unknown) => {
          this.isSubmitting.set(false);
          if (error instanceof HttpErrorResponse && error.status === 404) {
            this.loadError.set(INVALID_INVITATION);
          } else {
            this.submitError.set(apiErrorMessage(error, 'Accepting the invitation failed.'));
          }
        },
      });
  }

  private loadPreview(): void {
    this.api
      .preview(this.token())
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (preview) => {
          this.preview.set(preview);
          if (preview.name) this.form.controls.name.setValue(preview.name);
        },
        error: (error: unknown) => {
          const isGone =
            error instanceof HttpErrorResponse && (error.status === 404 || error.status === 400);
          this.loadError.set(
            isGone
              ? INVALID_INVITATION
              : apiErrorMessage(error, 'The invitation could not be loaded.'),
          );
        },
      });
  }
}

export default InvitationPage;
