import type { Channel } from '../core/channels';

/** The values a channel can physically take, in its canonical unit. */
export interface PlausibleRange {
  /** The lowest plausible value; itself plausible unless `isMinExclusive`. */
  readonly min: number;
  /** Whether `min` itself is implausible (lambda 0 would mean no air at all). */
  readonly isMinExclusive?: boolean;
  /** The highest plausible value, itself plausible. */
  readonly max: number;
  /** The canonical unit as people write it, for messages ('' when dimensionless). */
  readonly unit: string;
}

/**
 * Physical limits of each channel in its canonical unit (rpm, kPa absolute, lambda, °C, %,
 * km/h, degrees), checked on import after unit conversion: a row with a value outside its
 * channel's range is dropped and reported. Generous on purpose — they are there to catch
 * garbage (a glitched frame, a shifted column, a sentinel such as 99 999 999), never to judge
 * whether the engine ran well; the filter stage does that.
 *
 * Channels left out have no limit: `time` (epoch timestamps and negative pre-trigger times are
 * both real; the import's time-order rule guards it), `gear` (loggers use their own codes for
 * neutral, reverse and "unknown"), the flags `closedLoop` and `fuelCut` (already only 0 or 1),
 * and `boost`, which is checked as `map` once the barometer has been added to it.
 */
export const PLAUSIBLE_RANGES: Readonly<Partial<Record<Channel, PlausibleRange>>> = {
  // Common practice, no published source. OBD-II PID 0x0C, (256A+B)/4, tops out at 16 383.75 rpm
  // (computed from the formula in reference.md §5 [C]), but that is the PID's coding, not an
  // engine's limit: ECUs logging their own channel go beyond it on high-revving engines.
  rpm: { min: 0, max: 25_000, unit: 'rpm' },
  // Common practice, no published source. OBD-II PID 0x0B reads A kPa and saturates at 255 kPa
  // (reference.md §5 [S]), which boosted engines pass (22.3 psig), so a far broader limit:
  // 1000 kPa absolute is about 130 psig, beyond any spark-ignition boost. Absolute pressure
  // cannot be below 0.
  map: { min: 0, max: 1000, unit: 'kPa' },
  // 30 kPa is the standard-atmosphere pressure at about 9.2 km, higher than any road: computed
  // [C] from the troposphere formula (USSA-1976, from memory [S*]) with reference.md §4's
  // sea-level values. 120 kPa is well above any sea-level weather: common practice, no
  // published source.
  baro: { min: 30, max: 120, unit: 'kPa' },
  // λ > 0 by definition (λ = 0 would be no air). The OBD-II wideband PIDs 0x24–0x2B and
  // 0x34–0x3B span 0 to <2 (their AB formula in reference.md §5 [S], range computed [C]), but a
  // wideband in fresh air (fuel cut) pins at its controller's lean limit, from about λ 1.6 to
  // well above 3: 10 keeps every such reading and drops garbage — common practice, no
  // published source.
  lambda: { min: 0, isMinExclusive: true, max: 10, unit: '' },
  // Commanded λ, PID 0x44, spans 0 to <2 (reference.md §5 [S]); the same limits as measured λ
  // so that a logger writing the target on a wideband's scale is kept — common practice, no
  // published source.
  lambdaTarget: { min: 0, isMinExclusive: true, max: 10, unit: '' },
  // OBD-II PID 0x0F, A − 40 °C: −40 to 215 °C (reference.md §5 [S]).
  iat: { min: -40, max: 215, unit: '°C' },
  // OBD-II PID 0x05, A − 40 °C: −40 to 215 °C (reference.md §5 [S]).
  ect: { min: -40, max: 215, unit: '°C' },
  // OBD-II PID 0x11, 100A/255, spans 0 to 100 % (reference.md §5 [S]); widened by 10 % each way
  // (common practice, no published source) because an ECU's own throttle channel reads a little
  // below 0 or above 100 % when the sensor's end voltages drift from their calibration, and
  // those are real idle and full-throttle rows.
  tps: { min: -10, max: 110, unit: '%' },
  // OBD-II PIDs 0x06–0x09, (A − 128)·100/128 spans −100 to 99.22 % (reference.md §5 [S]; the
  // top computed from the formula [C]). The top is rounded up to 100 %, common practice, no
  // published source: 99.22 % is the byte coding's limit, not the trim's.
  stft: { min: -100, max: 100, unit: '%' },
  // As stft (reference.md §5 [S]).
  ltft: { min: -100, max: 100, unit: '%' },
  // Common practice, no published source: faster than any road car, and never below 0.
  speed: { min: 0, max: 500, unit: 'km/h' },
  // Common practice, no published source: spark advance stays within about −20 to 60° crank,
  // so no retard or knock correction logged with either sign goes beyond 60°.
  knock: { min: -60, max: 60, unit: '°' },
  // Common practice, no published source: duty computed from the requested pulse width goes
  // past 100 % when the injector cannot keep up, and such rows are real (and telling); twice
  // the cycle is no longer a reading.
  injDuty: { min: 0, max: 200, unit: '%' },
};

/**
 * The slack allowed past a limit, relative to it: a boundary value logged in another unit may
 * land a rounding error beyond the limit once converted, and must still pass.
 */
const ROUNDING_SLACK = 1e-9;

function slack(limit: number): number {
  return ROUNDING_SLACK * Math.max(1, Math.abs(limit));
}

/** The limits of a range with the rounding slack applied, as a tight loop compares them. */
export interface PlausibleBounds {
  /** Values below are implausible (and `low` itself too when `isLowExclusive`). */
  readonly low: number;
  /** Whether `low` itself is implausible. */
  readonly isLowExclusive: boolean;
  /** Values above are implausible. */
  readonly high: number;
}

/** The bounds `isPlausible` compares with; an exclusive minimum gets no slack. */
export function plausibleBounds(range: PlausibleRange): PlausibleBounds {
  const isLowExclusive = range.isMinExclusive === true;
  return {
    low: isLowExclusive ? range.min : range.min - slack(range.min),
    isLowExclusive,
    high: range.max + slack(range.max),
  };
}

/**
 * Whether `value` lies within `range` (limits included, but for an exclusive minimum). NaN is
 * plausible: a missing value is not an impossible one, and the importer reports it otherwise.
 */
export function isPlausible(value: number, range: PlausibleRange): boolean {
  const { low, isLowExclusive, high } = plausibleBounds(range);
  return !(value < low || value > high || (isLowExclusive && value === low));
}

/** A number as a message shows it: whole numbers exactly, others to 10 significant digits. */
function formatValue(value: number): string {
  return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(10)));
}

/** `range` for a person: "0 to 25000 rpm", "above 0, up to 10". */
export function describePlausibleRange(range: PlausibleRange): string {
  const unit = range.unit === '' ? '' : ` ${range.unit}`;
  return range.isMinExclusive
    ? `above ${range.min}, up to ${range.max}${unit}`
    : `${range.min} to ${range.max}${unit}`;
}

/**
 * The problem message for an implausible `value` of `channel` (in the canonical unit);
 * `converted` names what the value was made from when it is not the cell as written
 * ("after unit conversion", "boost + barometer"), so the person can find it in the file.
 */
export function implausibleMessage(
  channel: Channel,
  value: number,
  range: PlausibleRange,
  converted?: string,
): string {
  const unit = range.unit === '' ? '' : ` ${range.unit}`;
  const shown = converted === undefined ? formatValue(value) : `${formatValue(value)}${unit}`;
  const from = converted === undefined ? '' : ` (${converted})`;
  const allowed = describePlausibleRange(range);
  return `${channel} ${shown}${from} is outside the plausible range ${allowed}`;
}
