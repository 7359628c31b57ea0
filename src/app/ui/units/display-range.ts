import type { UnitSystem } from '@shared/contracts/preferences';
import { type ConversionContext, type Quantity, toDisplay, unitLabel } from './display-units';
import { QUANTITY_DIGITS, formatNumber } from './format-quantity';

/** A closed range in the unit it is shown in. */
export interface DisplayRange {
  /** Lowest accepted value, in the shown unit. */
  min: number;
  /** Highest accepted value, in the shown unit. */
  max: number;
  /** The shown unit's label. */
  unit: string;
}

/** Tolerance against binary noise when rounding (0.05 · 100 is 5.000000000000001). */
const EPSILON = 1e-9;

/**
 * A metric range `[min, max]` of `quantity` as the user's unit shows it. Metric passes through
 * unchanged. Converted ends are rounded *inward* to the digits the quantity is shown with, so
 * every value the shown range accepts converts back inside the API's range: a form can check
 * the shown numbers and the server will not refuse them.
 */
export function displayRange(
  quantity: Quantity,
  metric: { min: number; max: number },
  units: UnitSystem,
  context: ConversionContext = {},
): DisplayRange {
  const unit = unitLabel(quantity, units);
  if (units === 'metric') return { min: metric.min, max: metric.max, unit };
  const scale = 10 ** QUANTITY_DIGITS[units][quantity].max;
  const low = toDisplay(quantity, metric.min, units, context);
  const high = toDisplay(quantity, metric.max, units, context);
  return {
    min: Math.ceil(low * scale - EPSILON) / scale,
    max: Math.floor(high * scale + EPSILON) / scale,
    unit,
  };
}

/** A range as text, e.g. "3.1–1220.4 ci" (numbers as the quantity is shown). */
export function rangeText(range: DisplayRange, quantity: Quantity, units: UnitSystem): string {
  const digits = { min: 0, max: QUANTITY_DIGITS[units][quantity].max };
  return `${formatNumber(range.min, digits)}–${formatNumber(range.max, digits)} ${range.unit}`;
}
