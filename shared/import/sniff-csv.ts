import type { DecimalMark, Delimiter } from './column-mapping';
import { ImportError } from './import-error';
import { looksNumeric } from './parse-decimal';
import { parseUnitText } from './parse-unit-text';
import { splitCsvLine, splitLines } from './split-csv-line';

/** How much of a file the sniffer is meant to see (64 KiB of text). */
export const SNIFF_LENGTH = 65536;

/** One column as the sniffer found it. */
export interface SniffedColumn {
  /** The header text, trimmed, exactly as a mapping refers to it. */
  readonly name: string;
  /** The unit text from the units row, else from brackets at the end of the name, else null. */
  readonly unit: string | null;
  /** The column's position, from 0. */
  readonly index: number;
}

/** What the head of a CSV file says about its layout. Row numbers count lines from 0. */
export interface CsvSniff {
  /** The field delimiter. */
  readonly delimiter: Delimiter;
  /** The decimal mark of the numbers. */
  readonly decimal: DecimalMark;
  /** The line holding the column names. */
  readonly headerRow: number;
  /** The line holding units (just below or just above the header), or null. */
  readonly unitsRow: number | null;
  /** The columns, in file order. */
  readonly columns: readonly SniffedColumn[];
  /** The first line of data. */
  readonly firstDataRow: number;
  /** Up to 20 data rows split into cells, so a unit can be judged from the values. */
  readonly sampleRows: readonly (readonly string[])[];
}

/** Options of {@link sniffCsv}. */
export interface SniffOptions {
  /**
   * Whether the text may stop in the middle of a line (the head of a bigger file); then its last
   * line is not used. Defaults to true when the text is at least {@link SNIFF_LENGTH} long.
   */
  readonly isTruncated?: boolean;
}

// Ties between delimiters go to the rarer, more deliberate ones: a comma also appears inside
// decimal-comma numbers and free text.
const DELIMITER_PREFERENCE: readonly Delimiter[] = ['\t', ';', '|', ','];
const SAMPLE_ROWS = 20;
const DECIMAL_PROBE_ROWS = 200;

interface LineShape {
  readonly cells: readonly string[];
  readonly isBlank: boolean;
  readonly nonEmpty: number;
  readonly numeric: number;
}

/** Bracketed text at the end of a column name (`Boost [psig]` → `psig`), or null. */
export function bracketUnitText(name: string): string | null {
  const match = /[[(]([^[\]()]*)[\])]\s*$/.exec(name);
  return match ? (match[1] as string).trim() : null;
}

/** The delimiter whose field count is shared by the most lines (at least 2 fields). */
function detectDelimiter(lines: readonly string[]): { delimiter: Delimiter; width: number } {
  let best: { delimiter: Delimiter; width: number; support: number } | null = null;
  for (const delimiter of DELIMITER_PREFERENCE) {
    const tally = new Map<number, number>();
    for (const line of lines) {
      if (line.trim() === '') continue;
      const width = splitCsvLine(line, delimiter).length;
      if (width >= 2) tally.set(width, (tally.get(width) ?? 0) + 1);
    }
    for (const [width, support] of tally) {
      const isBetter =
        !best ||
        support > best.support ||
        (support === best.support && best.delimiter === delimiter && width > best.width);
      if (isBetter) best = { delimiter, width, support };
    }
  }
  if (!best) {
    throw new ImportError('no_header', 'no delimited columns found: the file is not a CSV log');
  }
  return best;
}

function shapeOf(line: string, delimiter: Delimiter): LineShape {
  const cells = splitCsvLine(line, delimiter).map((c) => c.trim());
  let nonEmpty = 0;
  let numeric = 0;
  for (const cell of cells) {
    if (cell === '') continue;
    nonEmpty++;
    if (looksNumeric(cell)) numeric++;
  }
  return { cells, isBlank: nonEmpty === 0, nonEmpty, numeric };
}

/** Share of a line's non-empty cells that name a known unit. */
function unitShare(shape: LineShape): number {
  if (shape.nonEmpty === 0) return 0;
  return shape.cells.filter((c) => c !== '' && parseUnitText(c) !== null).length / shape.nonEmpty;
}

function detectDecimal(
  shapes: readonly LineShape[],
  from: number,
  delimiter: Delimiter,
): DecimalMark {
  if (delimiter === ',') return '.';
  let commas = 0;
  let dots = 0;
  for (let i = from; i < shapes.length && i < from + DECIMAL_PROBE_ROWS; i++) {
    for (const cell of (shapes[i] as LineShape).cells) {
      if (/^[+-]?\d*,\d+$/.test(cell)) commas++;
      else if (/^[+-]?\d*\.\d+$/.test(cell)) dots++;
    }
  }
  return commas > dots ? ',' : '.';
}

function lastIndexWhere<T>(items: readonly T[], test: (item: T) => boolean): number {
  for (let i = items.length - 1; i >= 0; i--) if (test(items[i] as T)) return i;
  return -1;
}

/**
 * Reads the layout of a CSV log from the head of the file: delimiter, decimal mark, the header
 * row below any preamble (free text, `key: value` lines, blank lines), an optional units row
 * next to it, the columns and the first data row. Throws an {@link ImportError} (`no_header`
 * or `no_data`) when the text has no recognisable header or no data under it.
 */
export function sniffCsv(headText: string, options: SniffOptions = {}): CsvSniff {
  if (typeof headText !== 'string') throw new Error('sniffCsv: headText must be a string');
  const isTruncated = options.isTruncated ?? headText.length >= SNIFF_LENGTH;
  const lines = splitLines(headText.replace(/^\uFEFF/, ''));
  // A cut-off last line would disagree with the others; an empty one says nothing either.
  if (isTruncated && lines.length > 1) lines.pop();
  const { delimiter, width } = detectDelimiter(lines);
  const shapes = lines.map((line) => shapeOf(line, delimiter));
  const fits = (s: LineShape): boolean =>
    !s.isBlank && s.cells.length >= width - 1 && s.cells.length <= width + 1;
  const isText = (s: LineShape): boolean => fits(s) && s.numeric * 2 < s.nonEmpty;
  const isData = (s: LineShape): boolean => fits(s) && s.numeric * 2 >= s.nonEmpty;

  const firstData = shapes.findIndex(isData);
  const lastText = firstData < 0 ? lastIndexWhere(shapes, isText) : -1;
  if (lastText >= 0) {
    throw new ImportError('no_data', `the file has a header (row ${lastText}) but no data rows`, {
      row: lastText,
    });
  }
  // The text lines right above the data (blank lines allowed between): header and maybe units.
  const above: number[] = [];
  for (let i = firstData - 1; i >= 0 && above.length < 2; i--) {
    const shape = shapes[i] as LineShape;
    if (shape.isBlank) continue;
    if (!isText(shape)) break;
    above.push(i);
  }
  if (firstData < 0 || above.length === 0) {
    throw new ImportError('no_header', 'no header row found above the first row of numbers', {
      row: Math.max(firstData, 0),
    });
  }
  let headerRow = above[0] as number;
  let unitsRow: number | null = null;
  if (above.length === 2) {
    const near = unitShare(shapes[above[0] as number] as LineShape);
    const far = unitShare(shapes[above[1] as number] as LineShape);
    if (near >= 0.5 && near > far) {
      headerRow = above[1] as number;
      unitsRow = above[0] as number;
    } else if (far >= 0.5 && far > near) {
      unitsRow = above[1] as number;
    }
  }

  const header = shapes[headerRow] as LineShape;
  const units = unitsRow === null ? null : (shapes[unitsRow] as LineShape);
  const columns = header.cells.map((name, index): SniffedColumn => {
    const fromRow = units?.cells[index] ?? '';
    return { name, unit: fromRow !== '' ? fromRow : bracketUnitText(name), index };
  });
  const sampleRows: string[][] = [];
  for (let i = firstData; i < shapes.length && sampleRows.length < SAMPLE_ROWS; i++) {
    const shape = shapes[i] as LineShape;
    if (isData(shape)) sampleRows.push([...shape.cells]);
  }
  return {
    delimiter,
    decimal: detectDecimal(shapes, firstData, delimiter),
    headerRow,
    unitsRow,
    columns,
    firstDataRow: firstData,
    sampleRows,
  };
}
