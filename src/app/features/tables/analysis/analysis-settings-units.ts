/**
 * The analysis settings in the user's units. The API takes MAP in kPa (absolute), the MAP rate
 * in kPa/s and the coolant temperature in °C; an imperial user types psi(a), psi/s and °F. These
 * functions move the measured fields between the two and give their ranges in the shown unit,
 * as `vehicle-form-units.ts` does for the vehicle form: an untouched field goes back exactly.
 */
import type { UnitSystem } from '@shared/contracts/preferences';
import { displayRange } from '../../../ui/units/display-range';
import { type Quantity, fromDisplay, toDisplay, unitLabel } from '../../../ui/units/display-units';
import { QUANTITY_DIGITS } from '../../../ui/units/format-quantity';
import {
  type AnalysisSettingKey,
  SETTING_RANGES,
  type SettingRange,
} from './analysis-setting-ranges';
import type { SettingsValue } from './analysis-settings-model';

/** A measured settings field: its quantity, and whether it is that quantity per second. */
interface MeasuredSettingUnit {
  /** The quantity (its conversion has no offset when `perSecond`: pressure). */
  readonly quantity: Quantity;
  /** Whether the field is a rate of change of the quantity, per second. */
  readonly perSecond: boolean;
}

/** The settings fields that hold a measured quantity, and which quantity each is. */
export const MEASURED_SETTINGS = {
  'warmUp.minEctC': { quantity: 'temperature', perSecond: false },
  'mapRate.maxKpaPerS': { quantity: 'pressure', perSecond: true },
  leanLoadKpa: { quantity: 'pressure', perSecond: false },
} as const satisfies Partial<Record<AnalysisSettingKey, MeasuredSettingUnit>>;

/** One measured settings field. */
export type MeasuredSetting = keyof typeof MEASURED_SETTINGS;

/** The measured fields, in form order. */
export const MEASURED_SETTING_KEYS = Object.keys(MEASURED_SETTINGS) as MeasuredSetting[];

/** A measured value as the form showed it, and the API value it stands for. */
export interface ShownOrigin {
  /** The number put into the field. */
  readonly shown: number;
  /** The metric value it was converted from. */
  readonly metric: number;
}

/** What the form put into each measured field, by field. */
export type ShownOrigins = Partial<Record<MeasuredSetting, ShownOrigin>>;

/** Whether `key` is a measured field. */
export function isMeasuredSetting(key: AnalysisSettingKey): key is MeasuredSetting {
  return key in MEASURED_SETTINGS;
}

/**
 * The unit a measured field is typed in: the quantity's label, a rate's unit per second. A
 * pressure rate is a difference of pressures, so it reads "psi/s", not "psi(a)/s".
 */
function shownUnit(key: MeasuredSetting, units: UnitSystem): string {
  const { quantity, perSecond } = MEASURED_SETTINGS[key];
  if (!perSecond) return unitLabel(quantity, units);
  return units === 'imperial' && quantity === 'pressure' ? 'psi/s' : SETTING_RANGES[key].unit;
}

/**
 * A settings field's range in the shown units: a measured one converted, its ends rounded inward
 * so a value the form accepts is one the server accepts; any other field as the API has it.
 */
export function shownSettingRange(key: AnalysisSettingKey, units: UnitSystem): SettingRange {
  const range = SETTING_RANGES[key];
  if (units === 'metric' || !isMeasuredSetting(key)) return range;
  const shown = displayRange(MEASURED_SETTINGS[key].quantity, range, units);
  return { ...range, min: shown.min, max: shown.max, unit: shownUnit(key, units) };
}

/**
 * A metric value as the field shows it: unchanged in metric, converted and rounded to the
 * quantity's display digits in imperial (0.01 psi, 0.1 °F).
 */
export function shownSettingValue(key: MeasuredSetting, metric: number, units: UnitSystem): number {
  if (units === 'metric') return metric;
  const { quantity } = MEASURED_SETTINGS[key];
  const scale = 10 ** QUANTITY_DIGITS[units][quantity].max;
  return Math.round(toDisplay(quantity, metric, units) * scale) / scale;
}

/**
 * A typed value back in the API's unit. A field that still holds exactly what the form put there
 * (`origin`) gives the original metric value: opening and running in imperial must not move
 * 90 kPa to 89.98 kPa through the rounding of the shown 13.05 psi(a).
 */
export function metricSettingValue(
  key: MeasuredSetting,
  shown: number | null,
  units: UnitSystem,
  origin?: ShownOrigin,
): number | null {
  if (shown === null) return null;
  if (origin !== undefined && origin.shown === shown) return origin.metric;
  return fromDisplay(MEASURED_SETTINGS[key].quantity, shown, units);
}

/** Reads and writes each measured field of a form value. */
const FIELDS: Readonly<
  Record<
    MeasuredSetting,
    {
      get: (value: SettingsValue) => number | null;
      set: (value: SettingsValue, x: number | null) => void;
    }
  >
> = {
  'warmUp.minEctC': {
    get: (v) => v.filters.warmUp.minEctC,
    set: (v, x) => (v.filters.warmUp.minEctC = x),
  },
  'mapRate.maxKpaPerS': {
    get: (v) => v.filters.mapRate.maxKpaPerS,
    set: (v, x) => (v.filters.mapRate.maxKpaPerS = x),
  },
  leanLoadKpa: { get: (v) => v.leanLoadKpa, set: (v, x) => (v.leanLoadKpa = x) },
};

/** A copy of a form value whose measured fields can be written without touching the original. */
function copyMeasured(value: SettingsValue): SettingsValue {
  const f = value.filters;
  return {
    ...value,
    filters: { ...f, warmUp: { ...f.warmUp }, mapRate: { ...f.mapRate } },
  };
}

/** A metric form value as the form shows it in `units`, with what was put into each field. */
export function settingsShown(
  metric: SettingsValue,
  units: UnitSystem,
): { value: SettingsValue; origins: ShownOrigins } {
  const value = copyMeasured(metric);
  const origins: ShownOrigins = {};
  for (const key of MEASURED_SETTING_KEYS) {
    const number = FIELDS[key].get(metric);
    if (number === null) continue;
    const shown = shownSettingValue(key, number, units);
    FIELDS[key].set(value, shown);
    origins[key] = { shown, metric: number };
  }
  return { value, origins };
}

/** A form value typed in `units` back in the API's units (untouched fields exactly). */
export function settingsInMetric(
  shown: SettingsValue,
  units: UnitSystem,
  origins: ShownOrigins,
): SettingsValue {
  if (units === 'metric') return shown;
  const value = copyMeasured(shown);
  for (const key of MEASURED_SETTING_KEYS) {
    FIELDS[key].set(value, metricSettingValue(key, FIELDS[key].get(shown), units, origins[key]));
  }
  return value;
}
