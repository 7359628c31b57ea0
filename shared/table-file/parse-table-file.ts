import { validateTable } from '../core/table';
import { kpaPer, type PressureUnit } from '../units/units';
import {
  readTableLayout,
  type CellPosition,
  type PlacedNumbers,
  type TableDecimal,
  type TableDelimiter,
  type TableLayout,
} from './read-table-layout';
import { TableFileError, type TableAxisName } from './table-file-error';
import { labelledPressureUnits, orientationHint, type TableOrientation } from './table-labels';

/** Options of {@link parseTableFile}; both default to `'auto'`. */
export interface ParseTableFileOptions {
  /** Which axis runs down the first column; `'auto'` decides from the numbers and labels. */
  readonly orientation?: TableOrientation | 'auto';
  /** The unit of the MAP breakpoints (absolute); `'auto'` reads it from the file's labels. */
  readonly pressureUnit?: PressureUnit | 'auto';
}

/**
 * A table read from a file: the fields `POST /api/vehicles/:id/tables` takes (`rpmAxis`,
 * `mapAxisKpa`, `values` with rows following the MAP axis), plus what the parser decided and
 * what the user should look at in the preview.
 */
export interface TableFileResult {
  /** RPM breakpoints, ascending. */
  rpmAxis: number[];
  /** MAP breakpoints in kPa absolute, ascending (converted from `pressureUnit`). */
  mapAxisKpa: number[];
  /** VE in percent, `values[row][col]`: rows follow `mapAxisKpa`, columns `rpmAxis`. */
  values: number[][];
  /** How the file ran: MAP breakpoints down the first column (`map-rows`) or RPM ones. */
  orientation: TableOrientation;
  /** Why that orientation, in words for the preview. */
  orientationReason: string;
  /** The unit the file's MAP breakpoints were read in. */
  pressureUnit: PressureUnit;
  /** The separator found. */
  delimiter: TableDelimiter;
  /** The decimal mark found. */
  decimal: TableDecimal;
  /** The first label line above the table, a name the user may want to keep; else null. */
  title: string | null;
  /** Things the user should check before saving; empty when the file said everything. */
  warnings: string[];
}

// Mirrors of the API's limits in shared/contracts/tables.ts (MIN_VE, MAX_VE, MAX_BREAKPOINTS
// and the axis ranges); kept here so the parser pulls no zod into the browser. The spec checks
// they agree.
/** The lowest VE in percent a cell may hold. */
export const TABLE_FILE_MIN_VE = 1;
/** The highest VE in percent a cell may hold. */
export const TABLE_FILE_MAX_VE = 300;
/** The most breakpoints an axis may have. */
export const TABLE_FILE_MAX_BREAKPOINTS = 64;
const RPM_RANGE = [0, 30000] as const;
const MAP_RANGE_KPA = [1, 1000] as const;

// An RPM axis reaches the thousands (yet stays below ~20000); a MAP axis in kPa, psi, bar or
// inHg absolute stays below 1000.
const RPM_LIKE_MIN = 1000;
const RPM_LIKE_MAX = 20000;
// No VE table's MAP axis tops out at 30 kPa absolute (idle vacuum alone is about that), while
// psi, bar and inHg absolute axes do: such small numbers without a unit are not read as kPa.
const SMALL_PRESSURE_MAX = 30;

const AXIS_WORDS: Readonly<Record<TableAxisName, string>> = { rpm: 'RPM', map: 'MAP' };

function maxOf(values: readonly number[]): number {
  return Math.max(...values);
}

function requireCount(axis: PlacedNumbers, layout: TableLayout, isColumnAxis: boolean): void {
  const where = isColumnAxis ? `the header row (row ${layout.headerRow})` : 'the first column';
  const count = axis.values.length;
  if (count < 2) {
    const last = axis.positions[count - 1];
    throw new TableFileError(
      'too_few_breakpoints',
      `${where} has ${count} breakpoint${count === 1 ? '' : 's'}; a table needs at least 2 ` +
        `on each axis.`,
      isColumnAxis
        ? { row: layout.headerRow, column: 1 }
        : { row: last?.row ?? layout.headerRow, column: 0 },
    );
  }
  if (count > TABLE_FILE_MAX_BREAKPOINTS) {
    const first = axis.positions[TABLE_FILE_MAX_BREAKPOINTS] as CellPosition;
    throw new TableFileError(
      'too_many_breakpoints',
      `${where} has ${count} breakpoints; at most ${TABLE_FILE_MAX_BREAKPOINTS} are taken.`,
      first,
    );
  }
}

/** What the numbers alone say: the axis reaching the thousands is RPM, if only one does. */
function orientationFromValues(
  layout: TableLayout,
): { orientation: TableOrientation; why: string } | null {
  const columnMax = maxOf(layout.columnAxis.values);
  const rowMax = maxOf(layout.rowAxis.values);
  const isRpm = (max: number): boolean => max >= RPM_LIKE_MIN && max <= RPM_LIKE_MAX;
  if (isRpm(columnMax) === isRpm(rowMax)) return null;
  return isRpm(columnMax)
    ? {
        orientation: 'map-rows',
        why:
          `the header row's breakpoints reach ${columnMax} (engine speeds) and the first ` +
          `column's ${rowMax} (pressures)`,
      }
    : {
        orientation: 'rpm-rows',
        why:
          `the first column's breakpoints reach ${rowMax} (engine speeds) and the header ` +
          `row's ${columnMax} (pressures)`,
      };
}

function describe(orientation: TableOrientation): string {
  return orientation === 'map-rows' ? 'MAP down the rows' : 'RPM down the rows';
}

function chooseOrientation(
  layout: TableLayout,
  wanted: TableOrientation | 'auto',
  warnings: string[],
): { orientation: TableOrientation; reason: string } {
  const fromValues = orientationFromValues(layout);
  const hint = orientationHint(layout);
  if (wanted !== 'auto') {
    const other = fromValues
      ? { orientation: fromValues.orientation, said: 'the numbers suggest' }
      : hint && { orientation: hint.orientation, said: `${hint.source} says` };
    if (other && other.orientation !== wanted) {
      warnings.push(
        `Read with ${describe(wanted)} as asked, though ${other.said} ` +
          `${describe(other.orientation)}.`,
      );
    }
    return { orientation: wanted, reason: `${describe(wanted)}, as chosen` };
  }
  if (fromValues) {
    if (hint && hint.orientation !== fromValues.orientation) {
      warnings.push(
        `Read with ${describe(fromValues.orientation)}: ${hint.source} says ` +
          `${describe(hint.orientation)}, but ${fromValues.why}.`,
      );
    }
    return {
      orientation: fromValues.orientation,
      reason: `${describe(fromValues.orientation)}: ${fromValues.why}`,
    };
  }
  if (hint) {
    return {
      orientation: hint.orientation,
      reason:
        `${describe(hint.orientation)}: ${hint.source} says so (the numbers alone do not ` +
        `tell)`,
    };
  }
  throw new TableFileError(
    'ambiguous_orientation',
    `Cannot tell which axis is RPM: the header row reaches ` +
      `${maxOf(layout.columnAxis.values)} and ` +
      `the first column ${maxOf(layout.rowAxis.values)}, and no label names them. Choose the ` +
      `orientation.`,
    { row: layout.headerRow, column: 0 },
  );
}

/** Throws on the first breakpoint that does not rise above the one before it. */
function requireAscending(axis: PlacedNumbers, name: TableAxisName): void {
  for (let i = 1; i < axis.values.length; i++) {
    const previous = axis.values[i - 1] as number;
    const value = axis.values[i] as number;
    if (value > previous) continue;
    const at = axis.positions[i] as CellPosition;
    const isDuplicate = value === previous;
    throw new TableFileError(
      isDuplicate ? 'duplicate_breakpoint' : 'falling_breakpoint',
      `The ${AXIS_WORDS[name]} axis ${isDuplicate ? 'repeats' : 'falls back to'} ${value} at ` +
        `breakpoint ${i} (row ${at.row}, column ${at.column}) after ${previous}; breakpoints ` +
        `must rise strictly.`,
      { ...at, axis: name, index: i },
    );
  }
}

function choosePressureUnit(
  layout: TableLayout,
  map: PlacedNumbers,
  wanted: PressureUnit | 'auto',
  warnings: string[],
): PressureUnit {
  const labelled = labelledPressureUnits(layout);
  const named = labelled[0];
  for (const other of labelled.slice(1)) {
    if (named && other.unit !== named.unit) {
      warnings.push(
        `Read the MAP axis in ${named.unit}, as ${named.source} names it; ` +
          `${other.source} names ${other.unit}.`,
      );
    }
  }
  if (wanted !== 'auto') {
    if (named && named.unit !== wanted) {
      warnings.push(
        `The MAP axis was read in ${wanted} as asked, though ${named.source} names ${named.unit}.`,
      );
    }
    if (!named && wanted === 'kPa' && maxOf(map.values) <= SMALL_PRESSURE_MAX) {
      warnings.push(
        `The MAP axis tops out at ${maxOf(map.values)} kPa and the file names no unit: ` +
          `kept as kPa as ` +
          `asked, but such small numbers usually mean psi or bar.`,
      );
    }
    return wanted;
  }
  if (named) return named.unit;
  if (maxOf(map.values) <= SMALL_PRESSURE_MAX) {
    throw new TableFileError(
      'ambiguous_pressure_unit',
      `The MAP breakpoints run ${map.values[0]} to ${maxOf(map.values)} and the file names no ` +
        `unit: that is too low for kPa and may be psi, bar or inHg. Say which unit the file uses.`,
      { ...(map.positions[0] as CellPosition), axis: 'map' },
    );
  }
  warnings.push('The file names no pressure unit; the MAP breakpoints were read as kPa absolute.');
  return 'kPa';
}

function requireWithin(
  values: readonly number[],
  axis: PlacedNumbers,
  name: TableAxisName,
  [min, max]: readonly [number, number],
  unit: string,
): void {
  values.forEach((value, i) => {
    if (value >= min && value <= max) return;
    const at = axis.positions[i] as CellPosition;
    throw new TableFileError(
      'axis_out_of_range',
      `${AXIS_WORDS[name]} breakpoint ${i} (row ${at.row}, column ${at.column}) is ` +
        `${Number(value.toFixed(3))} ${unit}; it must lie between ${min} and ${max} ${unit}.`,
      { ...at, axis: name, index: i },
    );
  });
}

function requireVeRange(layout: TableLayout): void {
  layout.values.forEach((row, i) => {
    row.forEach((value, j) => {
      if (value >= TABLE_FILE_MIN_VE && value <= TABLE_FILE_MAX_VE) return;
      const at = { row: layout.dataRows[i] as number, column: j + 1 };
      throw new TableFileError(
        'value_out_of_range',
        `Row ${at.row}, column ${at.column} holds ${value} %; VE must lie between ` +
          `${TABLE_FILE_MIN_VE} and ${TABLE_FILE_MAX_VE} %.`,
        at,
      );
    });
  });
}

/**
 * Reads a VE table with its axes from delimited text: our own export (`map_kpa\rpm` corner,
 * RPM across, MAP down) or its transpose, separated by commas, semicolons or tabs, with a
 * decimal point or comma, an optional label line above and an optional units row. Decides the
 * orientation and the pressure unit unless the caller forces them, converts the MAP axis to
 * kPa absolute and checks the whole table. Throws a {@link TableFileError} naming the row and
 * column at fault; never returns part of a table.
 */
export function parseTableFile(text: string, options: ParseTableFileOptions = {}): TableFileResult {
  const layout = readTableLayout(text);
  requireCount(layout.columnAxis, layout, true);
  requireCount(layout.rowAxis, layout, false);
  const warnings: string[] = [];
  const { orientation, reason } = chooseOrientation(
    layout,
    options.orientation ?? 'auto',
    warnings,
  );
  const isMapRows = orientation === 'map-rows';
  const rpm = isMapRows ? layout.columnAxis : layout.rowAxis;
  const map = isMapRows ? layout.rowAxis : layout.columnAxis;
  requireAscending(rpm, 'rpm');
  requireAscending(map, 'map');
  const pressureUnit = choosePressureUnit(layout, map, options.pressureUnit ?? 'auto', warnings);
  const factor = kpaPer(pressureUnit);
  const mapAxisKpa = map.values.map((v) => v * factor);
  const rpmAxis = [...rpm.values];
  requireWithin(rpmAxis, rpm, 'rpm', RPM_RANGE, 'rpm');
  requireWithin(mapAxisKpa, map, 'map', MAP_RANGE_KPA, 'kPa');
  requireVeRange(layout);
  if (pressureUnit !== 'kPa') {
    warnings.push(`MAP breakpoints converted from ${pressureUnit} (absolute) to kPa.`);
  }
  const values = isMapRows
    ? layout.values.map((row) => [...row])
    : mapAxisKpa.map((_, m) =>
        rpmAxis.map((__, r) => (layout.values[r] as readonly number[])[m] as number),
      );
  const result: TableFileResult = {
    rpmAxis,
    mapAxisKpa,
    values,
    orientation,
    orientationReason: reason,
    pressureUnit,
    delimiter: layout.delimiter,
    decimal: layout.decimal,
    title: layout.titles[0]?.text ?? null,
    warnings,
  };
  // The checks above place each fault in the file; this is the domain core's own verdict.
  validateTable(result);
  return result;
}
