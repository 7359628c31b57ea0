import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  type OnInit,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router } from '@angular/router';
import { apiErrorMessage, retryAfterMinutes } from '../../core/api/api-error';
import { Session } from '../../core/auth/session';
import { safeReturnUrl } from './return-url';

/** The sign-in form's controls. */
interface SignInForm {
  email: FormControl<string>;
  password: FormControl<string>;
}

/** The public sign-in page: e-mail and password, then back to where the user was going. */
@Component({
  selector: 'app-sign-in-page',
  templateUrl: './sign-in-page.html',
  styleUrl: './sign-in-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatButtonModule],
})
export class SignInPage implements OnInit {
  private readonly session = inject(Session);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  /** The `email` query parameter: pre-fills the form (after accepting an invitation). */
  readonly email = input<string>();

  /** The `returnUrl` query parameter: where to go after signing in. */
  readonly returnUrl = input<string>();

  /** The form. */
  protected readonly form = new FormGroup<SignInForm>({
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.email],
    }),
    password: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
  });

  /** The message of the last failed attempt, if any. */
  protected readonly errorMessage = signal<string | null>(null);

  /** Whether a sign-in request is on its way. */
  protected readonly isSubmitting = signal(false);

  /**
   * Whether the first session check found nobody signed in. Until then the form stays hidden, so
   * a signed-in user is sent on without the form flashing up first.
   */
  protected readonly needsSignIn = signal(false);

  ngOnInit(): void {
    this.prefillEmail();
    void this.leaveIfSignedIn();
  }

  /** Sends the credentials; on success goes to the return URL, else shows why not. */
  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, password } = this.form.getRawValue();
    this.isSubmitting.set(true);
    this.errorMessage.set(null);
    this.session
      .signIn(email.trim(), password)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => {
          this.isSubmitting.set(false);
          void this.router.navigateByUrl(safeReturnUrl(this.returnUrl()));
        },
        error: (error: unknown) => {
          this.isSubmitting.set(false);
          this.errorMessage.set(this.describeFailure(error));
        },
      });
  }

  /** Sends a user who is already signed in (e.g. a bookmarked sign-in page) to the return URL. */
  private async leaveIfSignedIn(): Promise<void> {
    const user = await this.session.whenLoaded();
    // The page may be gone by the time `/me` answers; navigating then would undo the user's move.
    if (this.destroyRef.destroyed) return;
    if (user === null) {
      this.needsSignIn.set(true);
      return;
    }
    // Replace the sign-in entry so Back does not land here and bounce forward again.
    void this.router.navigateByUrl(safeReturnUrl(this.returnUrl()), { replaceUrl: true });
  }

  private prefillEmail(): void {
    const email = this.email();
    if (email) this.form.controls.email.setValue(email);
  }

  private describeFailure(error: unknown): string {
    if (error instanceof HttpErrorResponse && error.status === 429) {
      const minutes = retryAfterMinutes(error);
      const wait =
        minutes === null ? 'a few minutes' : minutes === 1 ? 'a minute' : `${minutes} minutes`;
      return `Too many sign-in attempts. Wait ${wait}, then try again.`;
    }
    if (error instanceof HttpErrorResponse && error.status === 401) {
      return apiErrorMessage(error, 'Wrong e-mail or password');
    }
    return apiErrorMessage(error, 'Signing in failed.');
  }
}

export default SignInPage;
