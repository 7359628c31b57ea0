import { Pipe, type PipeTransform, inject } from '@angular/core';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { type FormatOptions, formatMixture } from './format-quantity';

/**
 * Shows a lambda value as the user wants mixture shown: `{{ lambda | mixture: stoichAfr }}` →
 * "0.85 λ" or "12.5 AFR". The vehicle's stoichiometric AFR is needed for AFR. Lambda error
 * percentages are the same either way and are not passed through this pipe.
 *
 * Impure for the same reason as `QuantityPipe`: the preference is a signal read here.
 */
@Pipe({ name: 'mixture', pure: false })
export class MixturePipe implements PipeTransform {
  private readonly preferences = inject(DisplayPreferences);

  /** The lambda as text in the chosen display; "—" for null, undefined or NaN. */
  transform(
    lambda: number | null | undefined,
    stoichAfr: number,
    options: Omit<FormatOptions, 'fuel'> = {},
  ): string {
    return formatMixture(lambda, this.preferences.mixture(), stoichAfr, options);
  }
}
