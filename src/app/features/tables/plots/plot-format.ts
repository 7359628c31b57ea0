/**
 * Number formatting and colour helpers shared by the plots: signed figures with a true minus
 * sign, lean/rich words, the limit of the diverging scale, and our scales sampled into colour
 * stops for ECharts.
 */
import type { UnitSystem } from '@shared/contracts/preferences';
import { colourAt, type ColourStop } from '../../../ui/parts/colour-scale';
import { fromDisplay, toDisplay, unitLabel } from '../../../ui/units/display-units';
import { formatQuantity } from '../../../ui/units/format-quantity';

/** Lambda error and change at or beyond this many percent take the full hue (as the grid). */
export const DIVERGING_LIMIT_PCT = 10;

/** The true minus sign, wider than a hyphen and read as "minus" by screen readers. */
export const MINUS = '\u2212';

/** A cell with no figure. */
export const NO_FIGURE = '–';

/** A row and column of the table (row = MAP breakpoint, col = RPM breakpoint). */
export interface CellRef {
  /** Row index: the MAP breakpoint, from 0. */
  readonly row: number;
  /** Column index: the RPM breakpoint, from 0. */
  readonly col: number;
}

/** `value` with `digits` decimals and its sign: "+4.2", "−3.1"; rounding to zero gives "0.0". */
export function signed(value: number, digits = 1): string {
  const rounded = Number(value.toFixed(digits));
  if (rounded === 0) return (0).toFixed(digits);
  const magnitude = Math.abs(rounded).toFixed(digits);
  return rounded > 0 ? `+${magnitude}` : `${MINUS}${magnitude}`;
}

/**
 * A lambda error in words with its glyph: "▲ +4.2 % lean", "▼ −3.1 % rich", "0.0 % on target".
 */
export function lambdaErrorText(errorPct: number, digits = 1): string {
  const text = signed(errorPct, digits);
  if (text.startsWith('+')) return `▲ ${text} % lean`;
  if (text.startsWith(MINUS)) return `▼ ${text} % rich`;
  return `${text} % on target`;
}

/** A whole number with thousands separators ("28,239"), in the product's English. */
export function grouped(value: number): string {
  return Math.round(value).toLocaleString('en-GB');
}

/** `count` colours evenly along `stops` (our OKLab interpolation), for ECharts colour lists. */
export function sampleStops(stops: readonly ColourStop[], count = 17): string[] {
  if (!Number.isInteger(count) || count < 2) throw new Error('sampleStops: count must be ≥ 2');
  return Array.from({ length: count }, (_, i) => colourAt(stops, i / (count - 1)));
}

/**
 * The cell whose breakpoints lie nearest to (`rpm`, `mapKpa`), each axis on its own: where a
 * sample's weight is largest. Axes must be ascending with at least one breakpoint.
 */
export function nearestCell(
  rpmAxis: readonly number[],
  mapAxisKpa: readonly number[],
  rpm: number,
  mapKpa: number,
): CellRef {
  return { row: nearestIndex(mapAxisKpa, mapKpa), col: nearestIndex(rpmAxis, rpm) };
}

function nearestIndex(axis: readonly number[], x: number): number {
  if (axis.length === 0) throw new Error('nearestCell: an axis has no breakpoints');
  let best = 0;
  for (let i = 1; i < axis.length; i++) {
    if (Math.abs(axis[i] - x) < Math.abs(axis[best] - x)) best = i;
  }
  return best;
}

/**
 * How the plots show MAP in the user's units: kPa as stored, or psi(a) for imperial (the table
 * and the API stay in kPa; only axes, names and tooltips change).
 */
export interface MapScale {
  /** The unit, "kPa" or "psi(a)". */
  readonly unit: string;
  /** A pressure in kPa in the shown unit. */
  readonly toShown: (kpa: number) => number;
  /** A pressure in the shown unit back in kPa. */
  readonly toKpa: (shown: number) => number;
  /** A breakpoint (kPa) as an axis or a line names it, without the unit. */
  readonly label: (kpa: number) => string;
  /** Decimals of a sample's MAP in a tooltip. */
  readonly digits: number;
  /** A value axis's ends are rounded outwards to a multiple of this, in the shown unit. */
  readonly step: number;
}

/** MAP in kPa, as the plots have always drawn it. */
const KPA_SCALE: MapScale = {
  unit: 'kPa',
  toShown: (kpa) => kpa,
  toKpa: (kpa) => kpa,
  label: (kpa) => String(kpa),
  digits: 1,
  step: 10,
};

/** The MAP scale of `units` (metric: kPa; imperial: psi(a), 0.01 psi on labels). */
export function mapScale(units: UnitSystem = 'metric'): MapScale {
  if (units === 'metric') return KPA_SCALE;
  return {
    unit: unitLabel('pressure', units),
    toShown: (kpa) => toDisplay('pressure', kpa, units),
    toKpa: (shown) => fromDisplay('pressure', shown, units),
    label: (kpa) => formatQuantity('pressure', kpa, units, { unit: false }),
    digits: 2,
    // 1 psi is about 7 kPa: about as coarse as the 10 kPa steps of the metric axis.
    step: 1,
  };
}
