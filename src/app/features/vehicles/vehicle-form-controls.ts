/** Validators and controls of the vehicle form (the dialog builds its form from them). */
import {
  type AbstractControl,
  FormControl,
  type ValidationErrors,
  type ValidatorFn,
  Validators,
} from '@angular/forms';
import { type FieldLimit, parseGearRatios } from './vehicle-form';

/** Validator: the control holds a whole number. */
export function wholeNumber(control: AbstractControl<number | null>): ValidationErrors | null {
  return control.value === null || Number.isInteger(control.value) ? null : { whole: true };
}

/** Validator: the text parses as a list of gear ratios; the error carries the reason. */
export function gearRatiosList(control: AbstractControl<string>): ValidationErrors | null {
  const { error } = parseGearRatios(control.value);
  return error === null ? null : { gearRatios: error };
}

/**
 * Validator: the number lies within the limit `limitOf` gives at validation time (limits in lb/h
 * move with the chosen fuel). Errors have the shape of Validators.min/max.
 */
export function withinLimit(limitOf: () => FieldLimit): ValidatorFn {
  return (control: AbstractControl<number | null>): ValidationErrors | null => {
    const value = control.value;
    if (value === null || Number.isNaN(value)) return null;
    const { min, max } = limitOf();
    if (value < min) return { min: { min, actual: value } };
    if (value > max) return { max: { max, actual: value } };
    return null;
  };
}

/** A required number control checked against the limit `limitOf` gives. */
export function numberControl(
  limitOf: () => FieldLimit,
  ...more: ValidatorFn[]
): FormControl<number | null> {
  return new FormControl<number | null>(null, {
    nonNullable: true,
    validators: [Validators.required, withinLimit(limitOf), ...more],
  });
}
