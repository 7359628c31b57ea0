import { Pipe, type PipeTransform, inject } from '@angular/core';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import type { Quantity } from './display-units';
import { type FormatOptions, formatQuantity } from './format-quantity';

/**
 * Shows a metric API value in the user's units: `{{ map | quantity: 'pressure' }}` → "14.7
 * psi(a)". Options: `{ unit: false }` for the bare number, `{ fuel }` for injector flow,
 * `{ digits }` to override the precision.
 *
 * Impure on purpose: it reads the preference signal, so a template using it is refreshed when
 * the user switches units. A pure pipe would be skipped while its arguments stay the same and
 * would keep showing the old unit.
 */
@Pipe({ name: 'quantity', pure: false })
export class QuantityPipe implements PipeTransform {
  private readonly preferences = inject(DisplayPreferences);

  /** The value as text in the chosen unit; "—" for null, undefined or NaN. */
  transform(
    value: number | null | undefined,
    quantity: Quantity,
    options: FormatOptions = {},
  ): string {
    return formatQuantity(quantity, value, this.preferences.units(), options);
  }
}
