/**
 * The vehicle form in the user's units. The API takes displacement in L, injector flow in cc/min
 * and tyre diameter in mm; an imperial user types ci, lb/h and in. These functions move the
 * three measured fields between the two, and give their ranges in the shown unit.
 */
import type { UnitSystem } from '@shared/contracts/preferences';
import type { Fuel } from '@shared/units';
import { displayRange } from '../../ui/units/display-range';
import { type Quantity, fromDisplay, toDisplay } from '../../ui/units/display-units';
import { type FieldLimit, VEHICLE_LIMITS } from './vehicle-form';

/** The form fields that hold a measured quantity, and which quantity each is. */
export const MEASURED_FIELDS = {
  displacementL: 'displacement',
  injectorCcMin: 'injectorFlow',
  tireDiameterMm: 'tyreDiameter',
} as const satisfies Record<string, Quantity>;

/** One measured field. */
export type MeasuredField = keyof typeof MEASURED_FIELDS;

/** The ranged fields of the vehicle form. */
export type VehicleLimitField = keyof typeof VEHICLE_LIMITS;

/**
 * Fraction digits a converted value is typed with: a hundredth of a cubic inch, lb/h or inch is
 * finer than any rating or tape measure, and keeps the field short.
 */
const CONVERTED_INPUT_DIGITS = 2;

/** Input steps (spinner increments) per measured field and unit system. */
const INPUT_STEPS: Readonly<Record<UnitSystem, Readonly<Record<MeasuredField, number>>>> = {
  metric: { displacementL: 0.1, injectorCcMin: 10, tireDiameterMm: 0.1 },
  imperial: { displacementL: 1, injectorCcMin: 1, tireDiameterMm: 0.01 },
};

/** A measured value as the form showed it, and the API value it stands for. */
export interface ShownOrigin {
  /** The number put into the field. */
  shown: number;
  /** The metric value it was converted from. */
  metric: number;
}

/**
 * Every ranged field's limits in the shown units: the measured fields converted (rounded inward,
 * so a value the form accepts is one the server accepts), the ratios unchanged. Injector flow in
 * lb/h depends on the fuel's density, hence `fuel`.
 */
export function formLimits(
  units: UnitSystem,
  fuel: Fuel,
): Readonly<Record<VehicleLimitField, FieldLimit>> {
  const converted = (field: MeasuredField): FieldLimit => {
    const limit = VEHICLE_LIMITS[field];
    const range = displayRange(MEASURED_FIELDS[field], limit, units, { fuel });
    return { name: limit.name, ...range };
  };
  return {
    ...VEHICLE_LIMITS,
    displacementL: converted('displacementL'),
    injectorCcMin: converted('injectorCcMin'),
    tireDiameterMm: converted('tireDiameterMm'),
  };
}

/** The spinner step of a measured field in the shown units. */
export function inputStep(field: MeasuredField, units: UnitSystem): number {
  return INPUT_STEPS[units][field];
}

/**
 * A metric value as the form shows it: unchanged in metric, converted and rounded to 0.01 in
 * imperial (a long binary tail would be unreadable in an input).
 */
export function shownValue(
  field: MeasuredField,
  metric: number,
  units: UnitSystem,
  fuel: Fuel,
): number {
  if (units === 'metric') return metric;
  const scale = 10 ** CONVERTED_INPUT_DIGITS;
  return Math.round(toDisplay(MEASURED_FIELDS[field], metric, units, { fuel }) * scale) / scale;
}

/**
 * A typed value back in the API's unit. When the field still holds exactly what the form put
 * there (`origin`), the original metric value is returned: opening and saving a vehicle in
 * imperial must not move 2.0 L to 2.00004 L through the rounding of the shown 122.05 ci.
 */
export function metricValue(
  field: MeasuredField,
  shown: number,
  units: UnitSystem,
  fuel: Fuel,
  origin?: ShownOrigin,
): number {
  if (origin !== undefined && origin.shown === shown) return origin.metric;
  return fromDisplay(MEASURED_FIELDS[field], shown, units, { fuel });
}
