import { Pipe, type PipeTransform, inject } from '@angular/core';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { MIXTURE_LABELS, type Quantity, unitLabel } from './display-units';

/**
 * The label of a quantity's unit in the user's units, for headers and suffixes:
 * `{{ 'pressure' | unitLabel }}` → "kPa" or "psi(a)"; `{{ 'mixture' | unitLabel }}` → "λ" or
 * "AFR". Impure for the same reason as `QuantityPipe`.
 */
@Pipe({ name: 'unitLabel', pure: false })
export class UnitLabelPipe implements PipeTransform {
  private readonly preferences = inject(DisplayPreferences);

  /** The label. */
  transform(quantity: Quantity | 'mixture'): string {
    return quantity === 'mixture'
      ? MIXTURE_LABELS[this.preferences.mixture()]
      : unitLabel(quantity, this.preferences.units());
  }
}
