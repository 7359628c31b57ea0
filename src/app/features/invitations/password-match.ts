import type {
  AbstractControl,
  FormControl,
  FormGroupDirective,
  NgForm,
  ValidationErrors,
  ValidatorFn,
} from '@angular/forms';
import type { ErrorStateMatcher } from '@angular/material/core';

/** The group-level error key set when the two passwords differ. */
export const PASSWORD_MISMATCH = 'passwordMismatch';

/** Group validator: the controls named `first` and `second` must hold the same value. */
export function passwordsMatch(first: string, second: string): ValidatorFn {
  return (group: AbstractControl): ValidationErrors | null => {
    const a = group.get(first)?.value as unknown;
    const b = group.get(second)?.value as unknown;
    return a === b ? null : { [PASSWORD_MISMATCH]: true };
  };
}

/**
 * Shows the repeat field in error when it is invalid itself or when the group reports a
 * mismatch; Material would otherwise ignore a group-level error on a single field.
 */
export class RepeatPasswordErrorMatcher implements ErrorStateMatcher {
  /** Whether the repeat field should show its error. */
  isErrorState(control: FormControl | null, form: FormGroupDirective | NgForm | null): boolean {
    if (control === null) return false;
    const shown = control.touched || (form?.submitted ?? false);
    return shown && (control.invalid || (form?.hasError(PASSWORD_MISMATCH) ?? false));
  }
}
