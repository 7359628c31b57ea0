import type { MixtureDisplay, UnitSystem } from '@shared/contracts/preferences';
import {
  type ConversionContext,
  MIXTURE_LABELS,
  type Quantity,
  mixtureToDisplay,
  toDisplay,
  unitLabel,
} from './display-units';

/** Fraction digits of a shown number: at least `min`, at most `max` (trailing zeros dropped). */
export interface FractionDigits {
  /** Fewest fraction digits. */
  min: number;
  /** Most fraction digits. */
  max: number;
}

/**
 * How precisely each quantity is shown in each system: about the resolution the trade works at
 * (a tenth of a kPa, a hundredth of a psi, a whole cubic inch is too coarse for small engines).
 */
export const QUANTITY_DIGITS: Readonly<
  Record<UnitSystem, Readonly<Record<Quantity, FractionDigits>>>
> = {
  metric: {
    pressure: { min: 0, max: 1 },
    temperature: { min: 0, max: 1 },
    displacement: { min: 1, max: 2 },
    injectorFlow: { min: 0, max: 1 },
    tyreDiameter: { min: 0, max: 1 },
    speed: { min: 0, max: 1 },
  },
  imperial: {
    pressure: { min: 1, max: 2 },
    temperature: { min: 0, max: 1 },
    displacement: { min: 0, max: 1 },
    injectorFlow: { min: 1, max: 1 },
    tyreDiameter: { min: 1, max: 2 },
    speed: { min: 0, max: 1 },
  },
};

/** Digits of lambda (0.85, 0.853) and of AFR (12.5, 12.49). */
export const MIXTURE_DIGITS: Readonly<Record<MixtureDisplay, FractionDigits>> = {
  lambda: { min: 2, max: 3 },
  afr: { min: 1, max: 2 },
};

/** Text for a value that is missing or not a number. */
export const MISSING_VALUE = '—';

/** Options of {@link formatQuantity} and {@link formatMixture}. */
export interface FormatOptions extends ConversionContext {
  /** Whether to write the unit after the number (default true). */
  unit?: boolean;
  /** Digits to use instead of the quantity's own. */
  digits?: FractionDigits;
}

/**
 * A number with between `digits.min` and `digits.max` fraction digits, decimal point, no
 * grouping (the same in every locale, so values can be copied back into a form), "−0" as "0".
 */
export function formatNumber(value: number, digits: FractionDigits): string {
  if (!Number.isFinite(value)) return MISSING_VALUE;
  // Halves round away from zero as people expect (0.85 × 14.7 = 12.495 → 12.50), which plain
  // toFixed misses when the product lands a hair below the half in binary (12.49499…).
  const scale = 10 ** digits.max;
  const rounded = (Math.sign(value) * Math.round(Math.abs(value) * scale + 1e-7)) / scale;
  const fixed = rounded.toFixed(digits.max);
  let text = fixed;
  if (digits.max > digits.min) {
    const [whole, fraction = ''] = fixed.split('.');
    const kept = fraction.replace(/0+$/, '').padEnd(digits.min, '0');
    text = kept === '' ? (whole ?? fixed) : `${whole}.${kept}`;
  }
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/**
 * A metric value of `quantity` as the user wants to see it, e.g. 101.3 kPa → "14.69 psi(a)" in
 * imperial. Null, undefined and NaN read "—".
 */
export function formatQuantity(
  quantity: Quantity,
  metric: number | null | undefined,
  units: UnitSystem,
  options: FormatOptions = {},
): string {
  if (metric === null || metric === undefined || !Number.isFinite(metric)) return MISSING_VALUE;
  const shown = toDisplay(quantity, metric, units, options);
  const text = formatNumber(shown, options.digits ?? QUANTITY_DIGITS[units][quantity]);
  return options.unit === false ? text : `${text} ${unitLabel(quantity, units)}`;
}

/**
 * Lambda as the user wants to see it: "0.85 λ" or, with the vehicle's stoichiometric ratio,
 * "12.5 AFR". Null, undefined and NaN read "—".
 */
export function formatMixture(
  lambda: number | null | undefined,
  mixture: MixtureDisplay,
  stoichAfr: number,
  options: Omit<FormatOptions, 'fuel'> = {},
): string {
  if (lambda === null || lambda === undefined || !Number.isFinite(lambda)) return MISSING_VALUE;
  const shown = mixtureToDisplay(lambda, mixture, stoichAfr);
  const text = formatNumber(shown, options.digits ?? MIXTURE_DIGITS[mixture]);
  return options.unit === false ? text : `${text} ${MIXTURE_LABELS[mixture]}`;
}
