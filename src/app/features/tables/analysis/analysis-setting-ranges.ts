/**
 * The allowed values of every number field of the analysis settings and the apply options,
 * and the sentences that refuse a value outside them.
 */

/**
 * A number field's allowed values. The figures are those of `@shared/contracts/analyses`, which
 * cannot be imported here without pulling zod into the client bundle;
 * `analysis-settings-model.spec.ts` checks every one against the schemas.
 */
export interface SettingRange {
  /** The field's name for a person. */
  readonly label: string;
  /** Unit shown after numbers ('' for none). */
  readonly unit: string;
  /** Lowest value. */
  readonly min: number;
  /** Highest value (always allowed). */
  readonly max: number;
  /** Whether `min` itself is refused (the value must be above it). */
  readonly isMinExclusive?: boolean;
  /** Whether only whole numbers are allowed. */
  readonly isInteger?: boolean;
}

/** Every number field of the analysis settings and the apply options, by key. */
export const SETTING_RANGES = {
  'warmUp.minEctC': { label: 'Lowest coolant temperature', unit: '°C', min: -40, max: 130 },
  'fuelCut.leanLimitLambda': { label: 'Fuel-cut lambda', unit: '', min: 1, max: 10 },
  'fuelCut.settleS': { label: 'Fuel-cut settle time', unit: 's', min: 0, max: 30 },
  'tipIn.maxTpsRatePctPerS': {
    label: 'Largest throttle rate',
    unit: '%/s',
    min: 0,
    max: 1000,
    isMinExclusive: true,
  },
  'tipIn.settleS': { label: 'Throttle settle time', unit: 's', min: 0, max: 30 },
  'rpmRate.maxRpmPerS': {
    label: 'Largest RPM rate',
    unit: 'rpm/s',
    min: 0,
    max: 100000,
    isMinExclusive: true,
  },
  'rpmRate.settleS': { label: 'RPM settle time', unit: 's', min: 0, max: 30 },
  'mapRate.maxKpaPerS': {
    label: 'Largest MAP rate',
    unit: 'kPa/s',
    min: 0,
    max: 10000,
    isMinExclusive: true,
  },
  'mapRate.settleS': { label: 'MAP settle time', unit: 's', min: 0, max: 30 },
  'lambdaRange.min': {
    label: 'Lowest lambda',
    unit: '',
    min: 0,
    max: 5,
    isMinExclusive: true,
  },
  'lambdaRange.max': {
    label: 'Highest lambda',
    unit: '',
    min: 0,
    max: 10,
    isMinExclusive: true,
  },
  'knock.maxDeg': { label: 'Largest knock retard', unit: '°', min: 0, max: 60 },
  'delay.tau0S': { label: 'Delay τ₀', unit: 's', min: 0, max: 2 },
  'delay.kGrams': { label: 'Delay K', unit: 'g', min: 0, max: 50 },
  stepFraction: { label: 'Step fraction', unit: '', min: 0, max: 1, isMinExclusive: true },
  maxStepPercent: {
    label: 'Largest step',
    unit: '%',
    min: 0,
    max: 100,
    isMinExclusive: true,
  },
  minWeight: { label: 'Minimum weight', unit: '', min: 0, max: 1e6 },
  maxSpread: { label: 'Largest spread', unit: '', min: 0, max: 1, isMinExclusive: true },
  leanLoadKpa: { label: 'Under load from', unit: 'kPa', min: 0, max: 500 },
  warnLeanPercent: {
    label: 'Lean warning',
    unit: '%',
    min: 0,
    max: 100,
    isMinExclusive: true,
  },
  'apply.stepFraction': {
    label: 'Step fraction',
    unit: '',
    min: 0,
    max: 1,
    isMinExclusive: true,
  },
  'apply.smooth': { label: 'Smoothing', unit: '', min: 0, max: 1 },
  'apply.maxReach': { label: 'Fill reach', unit: 'cells', min: 0, max: 100, isInteger: true },
} as const satisfies Record<string, SettingRange>;

/** A key of {@link SETTING_RANGES}. */
export type SettingKey = keyof typeof SETTING_RANGES;

/** A key of a number field of the analysis settings (not of the apply options). */
export type AnalysisSettingKey = Exclude<SettingKey, `apply.${string}`>;

/** Longest filter expression the API takes, characters. */
export const EXPRESSION_MAX_LENGTH = 500;
/** Longest revision message the apply takes, characters. */
export const APPLY_MESSAGE_MAX_LENGTH = 2000;

/** The allowed values in words, e.g. "above 0 and at most 1" or "from 0 to 2 s". */
export function rangeText(range: SettingRange): string {
  const unit = range.unit ? ` ${range.unit}` : '';
  const whole = range.isInteger ? 'a whole number ' : '';
  return range.isMinExclusive
    ? `${whole}above ${range.min} and at most ${range.max}${unit}`
    : `${whole}from ${range.min} to ${range.max}${unit}`;
}

/** Why `value` is refused for `range`, naming the field and the range; null when it fits. */
export function rangeProblem(range: SettingRange, value: number | null): string | null {
  const allowed = rangeText(range);
  if (value === null || !Number.isFinite(value)) return `${range.label}: enter ${allowed}.`;
  const isLow = range.isMinExclusive ? value <= range.min : value < range.min;
  if (isLow || value > range.max || (range.isInteger && !Number.isInteger(value))) {
    return `${range.label} must be ${allowed}.`;
  }
  return null;
}

/** Why a lambda range is refused as a whole (highest not above lowest), or null. */
export function lambdaOrderProblem(min: number | null, max: number | null): string | null {
  if (min === null || max === null || max > min) return null;
  return 'Highest lambda must be above lowest lambda.';
}

/** `{ [name]: value }` when the value is a number, else nothing (the core's default applies). */
export function optionalNumber<N extends string>(
  name: N,
  value: number | null,
): { [P in N]?: number } {
  return (value === null ? {} : { [name]: value }) as { [P in N]?: number };
}
