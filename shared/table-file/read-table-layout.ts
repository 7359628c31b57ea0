import { looksNumeric, parseDecimal } from '../import/parse-decimal';
import { parseUnitText } from '../import/parse-unit-text';
import { splitCsvLine, splitLines } from '../import/split-csv-line';
import { TableFileError } from './table-file-error';

/** The separators a table file may use. */
export type TableDelimiter = ',' | ';' | '\t';
/** The decimal marks a table file may use. */
export type TableDecimal = '.' | ',';

/** Where a number sits in the file: line and cell, both from 0. */
export interface CellPosition {
  readonly row: number;
  readonly column: number;
}

/** A list of numbers read from the file, each with its position. */
export interface PlacedNumbers {
  readonly values: readonly number[];
  readonly positions: readonly CellPosition[];
}

/**
 * A table as the file lays it out, before deciding which axis is which: the header row's
 * breakpoints, the first column's breakpoints and the values between them (`values[i][j]` sits
 * on data row i, header breakpoint j).
 */
export interface TableLayout {
  readonly delimiter: TableDelimiter;
  readonly decimal: TableDecimal;
  readonly headerRow: number;
  /** The text of the corner cell (may be empty). */
  readonly corner: string;
  readonly columnAxis: PlacedNumbers;
  readonly rowAxis: PlacedNumbers;
  readonly values: readonly (readonly number[])[];
  /** The file line of each data row. */
  readonly dataRows: readonly number[];
  /** The units row above or under the header, split into cells, or null. */
  readonly unitsRow: { readonly row: number; readonly cells: readonly string[] } | null;
  /** Lines above the table that were skipped as a label or title, in file order. */
  readonly titles: readonly { readonly row: number; readonly text: string }[];
}

interface Line {
  readonly row: number;
  /** All cells, trimmed. */
  readonly cells: readonly string[];
  /** The cells without trailing empty ones (spreadsheets pad lines with separators). */
  readonly filled: readonly string[];
  readonly numeric: number;
}

// Ties go to the rarer, more deliberate separators: a comma also appears in decimal-comma
// numbers and in free text.
const DELIMITERS: readonly TableDelimiter[] = ['\t', ';', ','];

function lineOf(text: string, row: number, delimiter: TableDelimiter): Line {
  const cells = splitCsvLine(text, delimiter).map((c) => c.trim());
  let end = cells.length;
  while (end > 0 && cells[end - 1] === '') end--;
  const filled = cells.slice(0, end);
  return { row, cells, filled, numeric: filled.filter(looksNumeric).length };
}

/** The separator whose cell count is shared by the most lines (at least 2 cells). */
function detectDelimiter(texts: readonly string[]): TableDelimiter | null {
  let best: { delimiter: TableDelimiter; support: number } | null = null;
  for (const delimiter of DELIMITERS) {
    const tally = new Map<number, number>();
    texts.forEach((text, row) => {
      const width = lineOf(text, row, delimiter).filled.length;
      if (width >= 2) tally.set(width, (tally.get(width) ?? 0) + 1);
    });
    const support = Math.max(0, ...tally.values());
    if (support > 0 && (!best || support > best.support)) best = { delimiter, support };
  }
  return best?.delimiter ?? null;
}

/** A decimal comma only where the separator is not a comma and commas outnumber points. */
function detectDecimal(lines: readonly Line[], delimiter: TableDelimiter): TableDecimal {
  if (delimiter === ',') return '.';
  let commas = 0;
  let points = 0;
  for (const line of lines) {
    for (const cell of line.filled) {
      if (/^[+-]?\d*,\d+$/.test(cell)) commas++;
      else if (/^[+-]?\d*\.\d+$/.test(cell)) points++;
    }
  }
  return commas > points ? ',' : '.';
}

/**
 * The number in a cell, or NaN. Strict about the mark: with a decimal comma a point is refused
 * (it may be a thousands separator, `4.500` rpm) and the other way round.
 */
export function readCellNumber(cell: string, decimal: TableDecimal): number {
  if (cell.includes(decimal === ',' ? '.' : ',')) return NaN;
  return parseDecimal(cell, decimal);
}

function numberAt(line: Line, column: number, decimal: TableDecimal, what: string): number {
  const cell = line.cells[column] ?? '';
  if (cell === '') {
    throw new TableFileError(
      'empty_cell',
      `Row ${line.row}, column ${column} is empty: every ${what} needs a number.`,
      { row: line.row, column },
    );
  }
  const value = readCellNumber(cell, decimal);
  if (Number.isNaN(value)) {
    const mark = decimal === ',' ? 'a decimal comma' : 'a decimal point';
    throw new TableFileError(
      'not_a_number',
      `Row ${line.row}, column ${column} holds "${cell}", not a number (this file uses ${mark}).`,
      { row: line.row, column },
    );
  }
  return value;
}

// A line of the table has at least two numbers and more numbers than text; a title, a label or
// a units row has fewer.
function isTableLine(line: Line): boolean {
  const nonEmpty = line.filled.filter((c) => c !== '').length;
  return line.numeric >= 2 && line.numeric * 2 >= nonEmpty;
}

function isBreakpointRow(line: Line): boolean {
  const [corner, ...rest] = line.filled;
  return !looksNumeric(corner ?? '') && rest.every(looksNumeric);
}

function refuseNumericCorner(header: Line, next: Line | undefined): never {
  if (next && next.filled.length === header.filled.length + 1) {
    throw new TableFileError(
      'missing_header',
      `Row ${header.row} has no corner cell: it holds ${header.filled.length} breakpoints while ` +
        `the rows under it have ${next.filled.length} cells. Put a label (for example ` +
        `map_kpa\\rpm) or an empty cell before the first breakpoint.`,
      { row: header.row, column: 0 },
    );
  }
  throw new TableFileError(
    'missing_header',
    `Row ${header.row} starts with a number, so the table has no header row: the first row ` +
      `must be a corner cell (a label such as map_kpa\\rpm, or empty) then the column breakpoints.`,
    { row: header.row, column: 0 },
  );
}

/** The data row's cells: padded trailing separators are forgiven, other width changes are not. */
function dataCells(line: Line, width: number, headerRow: number): Line {
  if (line.cells.length === width) return line;
  if (line.filled.length === width) return { ...line, cells: line.filled };
  const count = line.filled.length;
  throw new TableFileError(
    'ragged_row',
    `Row ${line.row} has ${count} cells where the header (row ${headerRow}) has ${width}.`,
    { row: line.row, column: Math.min(count, width) },
  );
}

/** The parts of a label cell: itself, then its pieces split at a backslash, `/` or `|`. */
export function labelParts(cell: string): string[] {
  return [cell, ...cell.split(/[\\/|]/).map((p) => p.trim())].filter((p) => p !== '');
}

// A units row holds no numbers and names at least one unit; a title names none in a cell of
// its own ("kPa" is a unit, "VE in kPa" a title).
function isUnitsLine(line: Line): boolean {
  return line.numeric === 0 && line.filled.some((c) => labelParts(c).some(isUnit));
}

function isUnit(text: string): boolean {
  return parseUnitText(text) !== null;
}

// A label split at the separator is joined back as written (without padding or quotes).
function lineText(line: Line, delimiter: TableDelimiter): string {
  const glue = delimiter === '\t' ? ' ' : `${delimiter} `;
  return line.filled.filter((c) => c !== '').join(glue);
}

/**
 * Reads the layout of a table file: separator, decimal mark, label lines, the header row with
 * its corner cell, an optional units row, the first column and the values, all as numbers with
 * their file positions. Throws a {@link TableFileError} for anything that is not a whole table.
 */
export function readTableLayout(text: string): TableLayout {
  const texts = splitLines(text.replace(/^\uFEFF/, ''));
  if (texts.every((t) => t.trim() === '')) {
    throw new TableFileError('empty_file', 'The file is empty: there is no table to read.');
  }
  const delimiter = detectDelimiter(texts);
  if (delimiter === null) {
    throw new TableFileError(
      'no_table',
      'No line has two or more cells separated by commas, semicolons or tabs: this is not a table.',
    );
  }
  const lines = texts
    .map((t, row) => lineOf(t, row, delimiter))
    .filter((line) => line.filled.length > 0);
  const decimal = detectDecimal(lines, delimiter);
  let headerAt = lines.findIndex(isTableLine);
  if (headerAt < 0) {
    throw new TableFileError('no_table', 'No row of numbers found: the file holds no table.');
  }
  // A header with a single breakpoint has too few numbers to look like a table line. When the
  // first table line starts with a number (data, not a header), a breakpoint row right above
  // it is the header, so the error can say what is missing rather than that there is none.
  const before = lines[headerAt - 1];
  const startsWithNumber = looksNumeric((lines[headerAt] as Line).filled[0] ?? '');
  if (startsWithNumber && before?.filled.length === 2 && isBreakpointRow(before)) headerAt--;
  const header = lines[headerAt] as Line;
  const above = lines.slice(0, headerAt);
  let next = headerAt + 1;
  const below = lines[next];
  const hasUnitsBelow = below !== undefined && below.numeric === 0;
  if (hasUnitsBelow) next++;
  if (looksNumeric(header.filled[0] ?? '')) refuseNumericCorner(header, lines[next]);

  const width = header.filled.length;
  const columnValues: number[] = [];
  const columnPositions: CellPosition[] = [];
  for (let column = 1; column < width; column++) {
    columnValues.push(numberAt(header, column, decimal, 'breakpoint'));
    columnPositions.push({ row: header.row, column });
  }
  const rowValues: number[] = [];
  const rowPositions: CellPosition[] = [];
  const values: number[][] = [];
  for (const raw of lines.slice(next)) {
    const line = dataCells(raw, width, header.row);
    rowValues.push(numberAt(line, 0, decimal, 'breakpoint'));
    rowPositions.push({ row: line.row, column: 0 });
    const rowOfValues: number[] = [];
    for (let column = 1; column < width; column++) {
      rowOfValues.push(numberAt(line, column, decimal, 'cell'));
    }
    values.push(rowOfValues);
  }

  // The line right above the header is a units row when nothing under the header was one.
  const last = above[above.length - 1];
  const unitsLine = hasUnitsBelow ? below : last && isUnitsLine(last) ? last : undefined;
  const titleLines = above.filter((line) => line !== unitsLine);
  return {
    delimiter,
    decimal,
    headerRow: header.row,
    corner: header.filled[0] ?? '',
    columnAxis: { values: columnValues, positions: columnPositions },
    rowAxis: { values: rowValues, positions: rowPositions },
    values,
    dataRows: rowPositions.map((p) => p.row),
    unitsRow: unitsLine ? { row: unitsLine.row, cells: unitsLine.filled } : null,
    titles: titleLines.map((line) => ({ row: line.row, text: lineText(line, delimiter) })),
  };
}
