import type { Channel } from '../core/channels';
import { validateMapping, type ColumnMapping, type Newline } from './column-mapping';
import { ImportError } from './import-error';
import { encodeAscii, findLineBreak, isBlankLine, LineCells } from './line-cells';
import type { LogBuildResult } from './log-build-result';
import {
  channelsToRead,
  resolveLogInputs,
  validateLogBuilderOptions,
  type LogBuilderOptions,
  type LogInput,
} from './log-inputs';
import { RowReader } from './row-reader';

export type { LogBuilderOptions } from './log-inputs';

/** Turns CSV rows, pushed chunk by chunk, into a {@link ColumnarLog}. */
export interface LogBuilder {
  /** Adds rows; `rows[i]` is line `firstRowNumber + i` of the file. */
  pushRows(rows: readonly (readonly string[])[], firstRowNumber: number): void;
  /**
   * Adds the lines of `text`, which holds no double quote, with the same result as `pushRows`
   * of `text.split(newline)` with each line split on the mapping's delimiter, but without making
   * a string per cell. Line i is line `firstRowNumber + i` of the file. Returns the line count.
   */
  pushUnquotedLines(text: string, newline: Newline, firstRowNumber: number): number;
  /** Ends the import; throws an ImportError when no usable sample came out. */
  finish(): LogBuildResult;
}

/**
 * Starts an import that applies `mapping` to CSV rows pushed in chunks of any size, converting
 * every mapped column to its channel's canonical unit (gauge boost + barometer → absolute MAP).
 * A row whose required channel cannot be read is dropped, one with a value (of any channel)
 * outside its channel's `PLAUSIBLE_RANGES` too, and one whose time goes back; each problem is
 * recorded with its line and column. Optional channels that cannot be read become NaN. Memory
 * stays about 8 bytes × channels × rows: values go straight into typed arrays.
 * Without `options.columns`, rows must be pushed from the top of the file so the builder meets
 * the header at `mapping.headerRow`.
 */
export function createLogBuilder(mapping: ColumnMapping, options: LogBuilderOptions): LogBuilder {
  validateMapping(mapping);
  validateLogBuilderOptions(options);
  const channels = channelsToRead(mapping, options);
  const { baroKpa = NaN, maxProblems = 1000, mostlyBadFraction = 0.5 } = options;
  const decimal = mapping.decimal ?? '.';
  const delimiter = mapping.delimiter ?? ',';
  const delimiterCode = delimiter.charCodeAt(0);
  const headerRow = mapping.headerRow;
  const unitsRow = mapping.unitsRow ?? null;
  if (options.columns === undefined && headerRow === undefined) {
    throw new Error('createLogBuilder: mapping.headerRow or options.columns is required');
  }
  const outputs: Channel[] = channels.map((c) => (c === 'boost' ? 'map' : c));
  const reader = new RowReader(channels, { decimal, baroKpa, maxProblems });
  let inputs: LogInput[] | null = null;
  /** Where each column's value goes when lines are scanned; null when they cannot be. */
  let slots: Int32Array | null = null;
  let cells: LineCells | null = null;
  let cellsNewline: Newline = '\n';
  let byteBuffer = new Uint8Array(0);
  let rowsRead = 0;
  let blankRows = 0;
  let pendingBlankRows = 0;
  let isFinished = false;

  const useHeader = (header: readonly string[]): void => {
    const resolved = resolveLogInputs(header, channels, mapping, options);
    inputs = resolved;
    // Scanning puts each column in one slot and reads the decimal mark as part of a number, so
    // a column feeding two channels, or a decimal comma that is also the delimiter, is split.
    const columns = new Int32Array(Math.max(...resolved.map((i) => i.index)) + 1).fill(-1);
    resolved.forEach((input, k) => (columns[input.index] = columns[input.index] === -1 ? k : -2));
    slots = delimiter !== decimal && !columns.includes(-2) ? columns : null;
  };
  if (options.columns !== undefined) useHeader(options.columns);

  const lineCells = (newline: Newline): LineCells => {
    if (cells === null || cellsNewline !== newline) {
      cells = new LineCells(slots as Int32Array, reader.values, delimiter, decimal, newline);
      cellsNewline = newline;
    }
    return cells;
  };

  /** Any row: header, units row, blank or data. */
  const acceptRow = (row: readonly string[], rowNumber: number): void => {
    if (headerRow !== undefined && rowNumber <= headerRow) {
      if (rowNumber === headerRow && inputs === null)
        useHeader(row.map((c) => c.replace(/^\uFEFF/, '').trim()));
      return;
    }
    if (rowNumber === unitsRow) return;
    if (inputs === null) {
      throw new Error(`LogBuilder.pushRows: row ${rowNumber} came before the header row`);
    }
    if (row.every((cell) => cell.trim() === '')) {
      pendingBlankRows++;
      return;
    }
    countDataRow();
    reader.readRow(row, rowNumber, inputs);
  };

  /** Blank lines count once data follows them, so a file's final line break never does. */
  const countDataRow = (): void => {
    blankRows += pendingBlankRows;
    pendingBlankRows = 0;
    rowsRead++;
  };

  const isScannedRow = (rowNumber: number): boolean =>
    slots !== null && (headerRow === undefined || rowNumber > headerRow) && rowNumber !== unitsRow;

  /** Pushes the lines of `text` row by row; returns the line count. */
  const pushSplitLines = (text: string, newline: Newline, firstRowNumber: number): number => {
    let rowNumber = firstRowNumber;
    for (let at = 0; ;) {
      const found = text.indexOf(newline, at);
      const end = found < 0 ? text.length : found;
      acceptRow(text.slice(at, end).split(delimiter), rowNumber++);
      if (found < 0) return rowNumber - firstRowNumber;
      at = found + newline.length;
    }
  };

  /** Pushes the lines of an ASCII `text` scanned as its `bytes`; returns the line count. */
  const pushByteLines = (
    text: string,
    bytes: Uint8Array,
    newline: Newline,
    firstRowNumber: number,
  ): number => {
    const scanner = lineCells(newline);
    const active = inputs as LogInput[];
    const length = bytes.length;
    let rowNumber = firstRowNumber;
    for (let at = 0; ; rowNumber++) {
      let end: number;
      const first = at < length ? (bytes[at] as number) : -1;
      if (isScannedRow(rowNumber) && first > 32 && first < 127 && first !== delimiterCode) {
        // A printable first character: not blank, so the scan finds the line's end itself.
        end = scanner.scan(bytes, at, length);
        countDataRow();
        reader.readScanned(text, rowNumber, active, scanner);
      } else {
        const found = findLineBreak(bytes, at, newline);
        end = found < 0 ? length : found;
        if (!isScannedRow(rowNumber)) acceptRow(text.slice(at, end).split(delimiter), rowNumber);
        else if (isBlankLine(bytes, at, end, delimiterCode)) pendingBlankRows++;
        else {
          scanner.scan(bytes, at, end);
          countDataRow();
          reader.readScanned(text, rowNumber, active, scanner);
        }
      }
      if (end === length) return rowNumber + 1 - firstRowNumber;
      at = end + newline.length;
    }
  };

  const checkOpen = (name: string): void => {
    if (isFinished) throw new Error(`LogBuilder.${name}: the builder has finished`);
  };
  const checkRowNumber = (name: string, firstRowNumber: number): void => {
    if (!Number.isInteger(firstRowNumber) || firstRowNumber < 0) {
      throw new Error(`LogBuilder.${name}: firstRowNumber must be an integer ≥ 0`);
    }
  };

  return {
    pushRows(rows, firstRowNumber) {
      checkOpen('pushRows');
      if (!Array.isArray(rows)) throw new Error('LogBuilder.pushRows: rows must be an array');
      checkRowNumber('pushRows', firstRowNumber);
      for (let i = 0; i < rows.length; i++) acceptRow(rows[i], firstRowNumber + i);
    },
    pushUnquotedLines(text, newline, firstRowNumber) {
      checkOpen('pushUnquotedLines');
      checkRowNumber('pushUnquotedLines', firstRowNumber);
      if (typeof text !== 'string') {
        throw new Error('LogBuilder.pushUnquotedLines: text must be a string');
      }
      if (newline !== '\n' && newline !== '\r\n' && newline !== '\r') {
        throw new Error('LogBuilder.pushUnquotedLines: newline must be \\n, \\r\\n or \\r');
      }
      // Preamble, header and units row go row by row; from the first data line on, the lines
      // are scanned as bytes when the text is ASCII, else split as papaparse would.
      let rowNumber = firstRowNumber;
      let at = 0;
      while (!isScannedRow(rowNumber)) {
        const found = text.indexOf(newline, at);
        const end = found < 0 ? text.length : found;
        acceptRow(text.slice(at, end).split(delimiter), rowNumber++);
        if (found < 0) return rowNumber - firstRowNumber;
        at = found + newline.length;
      }
      const rest = at === 0 ? text : text.slice(at);
      if (byteBuffer.length < rest.length) byteBuffer = new Uint8Array(rest.length * 1.25);
      const bytes = encodeAscii(rest, byteBuffer);
      const lines = bytes
        ? pushByteLines(rest, bytes, newline, rowNumber)
        : pushSplitLines(rest, newline, rowNumber);
      return rowNumber - firstRowNumber + lines;
    },
    finish() {
      isFinished = true;
      if (inputs === null)
        throw new ImportError('no_header', 'the header row was never reached', { row: headerRow });
      if (rowsRead === 0) throw new ImportError('no_data', 'the file has no data rows');
      const length = reader.length;
      const { droppedUnreadable, droppedTimeBack, droppedImplausible, problemCount } = reader;
      if (length === 0) {
        const first = reader.problems[0];
        const why =
          droppedImplausible === 0
            ? 'could be read'
            : `could be used (${droppedUnreadable} unreadable, ` +
              `${droppedImplausible} with implausible values)`;
        throw new ImportError('no_usable_rows', `none of the ${rowsRead} rows ${why}`, {
          row: first?.row,
          column: first?.column,
        });
      }
      const arrays = reader.takeArrays();
      const log: Partial<Record<Channel, Float64Array>> = {};
      outputs.forEach((channel, k) => (log[channel] = arrays[k]));
      const droppedFraction = (droppedUnreadable + droppedTimeBack + droppedImplausible) / rowsRead;
      return {
        log: { length, channels: log },
        problems: [...reader.problems],
        stats: {
          rowsRead,
          rowsKept: length,
          rowsDroppedUnreadable: droppedUnreadable,
          rowsDroppedTimeBack: droppedTimeBack,
          rowsDroppedImplausible: droppedImplausible,
          blankRows,
          problemCount,
          droppedFraction,
          isMostlyBad: droppedFraction > mostlyBadFraction,
        },
      };
    },
  };
}
