import type { Channel } from '../core/channels';
import {
  channelConverter,
  FLAG_CHANNELS,
  flagFromWord,
  type ValueConverter,
} from './channel-converter';
import { validateMapping, type ColumnMapping } from './column-mapping';
import { GrowableColumns } from './growable-columns';
import { ImportError } from './import-error';
import type { ImportProblem, LogBuildResult } from './log-build-result';
import { parseDecimal } from './parse-decimal';

/** Options of {@link createLogBuilder}. */
export interface LogBuilderOptions {
  /** The fuel's stoichiometric AFR, to turn AFR columns into lambda. */
  readonly stoichAfr: number;
  /** Barometric pressure (kPa) for gauge boost when the file logs none (or a cell is empty). */
  readonly baroKpa?: number;
  /** The header's column names, when the rows pushed start below the header. */
  readonly columns?: readonly string[];
  /** How many problems to keep in detail (default 1000); all are counted. */
  readonly maxProblems?: number;
  /** Above this share of dropped rows the file is flagged mostly bad (default 0.5). */
  readonly mostlyBadFraction?: number;
}

/** Turns CSV rows, pushed chunk by chunk, into a {@link ColumnarLog}. */
export interface LogBuilder {
  /** Adds rows; `rows[i]` is line `firstRowNumber + i` of the file. */
  pushRows(rows: readonly (readonly string[])[], firstRowNumber: number): void;
  /** Ends the import; throws an ImportError when no usable sample came out. */
  finish(): LogBuildResult;
}

interface Input {
  readonly channel: Channel;
  readonly column: string;
  readonly index: number;
  readonly convert: ValueConverter;
  readonly isRequired: boolean;
  readonly isFlag: boolean;
}

const REQUIRED_INPUTS: ReadonlySet<Channel> = new Set([
  'time',
  'rpm',
  'map',
  'boost',
  'lambda',
  'lambdaTarget',
]);

function validateOptions(options: LogBuilderOptions): void {
  const { stoichAfr, baroKpa, maxProblems, mostlyBadFraction } = options;
  if (!(stoichAfr > 0 && Number.isFinite(stoichAfr))) {
    throw new Error('createLogBuilder: options.stoichAfr must be a positive number');
  }
  if (baroKpa !== undefined && !(baroKpa > 0 && Number.isFinite(baroKpa))) {
    throw new Error('createLogBuilder: options.baroKpa must be a positive number of kPa');
  }
  if (maxProblems !== undefined && !(Number.isInteger(maxProblems) && maxProblems >= 0)) {
    throw new Error('createLogBuilder: options.maxProblems must be an integer ≥ 0');
  }
  if (mostlyBadFraction !== undefined && !(mostlyBadFraction >= 0 && mostlyBadFraction <= 1)) {
    throw new Error('createLogBuilder: options.mostlyBadFraction must be within 0–1');
  }
}

/** The channels a mapping feeds, boost left out when MAP is there; throws on missing ones. */
function channelsToRead(mapping: ColumnMapping, options: LogBuilderOptions): Channel[] {
  const mapped = (Object.keys(mapping.channels) as Channel[]).filter((c) => mapping.channels[c]);
  const has = (c: Channel): boolean => mapped.includes(c);
  const missing: string[] = (['time', 'rpm'] as const).filter((c) => !has(c));
  if (!has('map') && !has('boost')) missing.push('map');
  if (!has('map') && has('boost') && !has('baro') && options.baroKpa === undefined)
    missing.push('baro');
  missing.push(...(['lambda', 'lambdaTarget'] as const).filter((c) => !has(c)));
  if (missing.length > 0) {
    throw new ImportError(
      'missing_channels',
      `required channels not mapped: ${missing.join(', ')}`,
      { missing },
    );
  }
  return has('map') ? mapped.filter((c) => c !== 'boost') : mapped;
}

function findColumn(header: readonly string[], name: string): number {
  const exact = header.findIndex((h) => h.trim() === name.trim());
  if (exact >= 0) return exact;
  const folded = name.trim().toLowerCase();
  return header.findIndex((h) => h.trim().toLowerCase() === folded);
}

/**
 * Starts an import that applies `mapping` to CSV rows pushed in chunks of any size, converting
 * every mapped column to its channel's canonical unit (gauge boost + barometer → absolute MAP).
 * A row whose required channel cannot be read is dropped, one whose time goes back too; each
 * problem is recorded with its line and column. Optional channels that cannot be read become
 * NaN. Memory stays about 8 bytes × channels × rows: values go straight into typed arrays.
 * Without `options.columns`, rows must be pushed from the top of the file so the builder meets
 * the header at `mapping.headerRow`.
 */
export function createLogBuilder(mapping: ColumnMapping, options: LogBuilderOptions): LogBuilder {
  validateMapping(mapping);
  validateOptions(options);
  const channels = channelsToRead(mapping, options);
  const { stoichAfr, baroKpa = NaN, maxProblems = 1000, mostlyBadFraction = 0.5 } = options;
  const decimal = mapping.decimal ?? '.';
  const headerRow = mapping.headerRow;
  const unitsRow = mapping.unitsRow ?? null;
  if (options.columns === undefined && headerRow === undefined) {
    throw new Error('createLogBuilder: mapping.headerRow or options.columns is required');
  }
  const foldsBoost = channels.includes('boost');
  const outputs: Channel[] = channels.map((c) => (c === 'boost' ? 'map' : c));
  const store = new GrowableColumns(outputs.length);
  const scratch = new Float64Array(channels.length);
  const timeSlot = channels.indexOf('time');
  const boostSlot = channels.indexOf('boost');
  const baroSlot = channels.indexOf('baro');
  const problems: ImportProblem[] = [];
  let inputs: Input[] | null = null;
  let problemCount = 0;
  let rowsRead = 0;
  let blankRows = 0;
  let pendingBlankRows = 0;
  let droppedUnreadable = 0;
  let droppedTimeBack = 0;
  let isFinished = false;

  const report = (row: number, input: Input, message: string): void => {
    problemCount++;
    if (problems.length < maxProblems) {
      problems.push({ row, column: input.column, channel: input.channel, message });
    }
  };

  const resolveHeader = (header: readonly string[]): Input[] => {
    const resolved = channels.map((channel): Input => {
      const entry = mapping.channels[channel];
      const column = entry?.column ?? '';
      return {
        channel,
        column,
        index: findColumn(header, column),
        convert: channelConverter(channel, entry?.unit, stoichAfr),
        isRequired:
          REQUIRED_INPUTS.has(channel) ||
          (channel === 'baro' && foldsBoost && Number.isNaN(baroKpa)),
        isFlag: FLAG_CHANNELS.has(channel),
      };
    });
    const unknown = resolved.filter((i) => i.index < 0).map((i) => i.column);
    if (unknown.length > 0) {
      throw new ImportError(
        'unknown_column',
        `mapped columns not in the header: ${unknown.join(', ')}`,
        {
          missing: unknown,
          row: headerRow,
        },
      );
    }
    return resolved;
  };
  if (options.columns !== undefined) inputs = resolveHeader(options.columns);

  /** Reads one cell into the scratch slot; false when a required value is unreadable. */
  const readCell = (
    row: readonly string[],
    rowNumber: number,
    slot: number,
    input: Input,
  ): boolean => {
    const text = row[input.index] ?? '';
    let value = parseDecimal(text, decimal);
    if (input.isFlag && Number.isNaN(value)) value = flagFromWord(text);
    if (input.isFlag && value !== 0 && value !== 1 && !Number.isNaN(value)) {
      report(rowNumber, input, `flag is ${text.trim()}, not 0 or 1`);
      value = NaN;
    } else if (Number.isNaN(value)) {
      const isEmpty = text.trim() === '';
      // An empty optional cell is an unlogged sample, not a fault; garbage always is.
      if (!isEmpty || input.isRequired)
        report(rowNumber, input, isEmpty ? 'empty' : `not a number: "${text.trim()}"`);
    } else value = input.convert(value);
    scratch[slot] = value;
    return !(input.isRequired && !Number.isFinite(value));
  };

  const pushRow = (row: readonly string[], rowNumber: number, active: Input[]): void => {
    let isReadable = true;
    for (let k = 0; k < active.length; k++) {
      // Every cell is read even after a failure so that each bad cell is reported.
      if (!readCell(row, rowNumber, k, active[k] as Input)) isReadable = false;
    }
    if (isReadable && foldsBoost) {
      const baro =
        baroSlot >= 0 && Number.isFinite(scratch[baroSlot])
          ? (scratch[baroSlot] as number)
          : baroKpa;
      scratch[boostSlot] = (scratch[boostSlot] as number) + baro;
      if (!Number.isFinite(scratch[boostSlot])) {
        report(rowNumber, active[baroSlot] as Input, 'no barometer for gauge boost');
        isReadable = false;
      }
    }
    if (!isReadable) {
      droppedUnreadable++;
      return;
    }
    const time = scratch[timeSlot] as number;
    const lastTime = store.last(timeSlot);
    if (time < lastTime) {
      report(
        rowNumber,
        active[timeSlot] as Input,
        `time goes back from ${lastTime} s to ${time} s`,
      );
      droppedTimeBack++;
      return;
    }
    store.append(scratch);
  };

  return {
    pushRows(rows, firstRowNumber) {
      if (isFinished) throw new Error('LogBuilder.pushRows: the builder has finished');
      if (!Array.isArray(rows)) throw new Error('LogBuilder.pushRows: rows must be an array');
      if (!Number.isInteger(firstRowNumber) || firstRowNumber < 0) {
        throw new Error('LogBuilder.pushRows: firstRowNumber must be an integer ≥ 0');
      }
      for (let i = 0; i < rows.length; i++) {
        const row = rows[i] as readonly string[];
        const rowNumber = firstRowNumber + i;
        if (headerRow !== undefined && rowNumber <= headerRow) {
          if (rowNumber === headerRow && inputs === null)
            inputs = resolveHeader(row.map((c) => c.replace(/^\uFEFF/, '').trim()));
          continue;
        }
        if (rowNumber === unitsRow) continue;
        if (inputs === null) {
          throw new Error(`LogBuilder.pushRows: row ${rowNumber} came before the header row`);
        }
        if (row.every((cell) => cell.trim() === '')) {
          pendingBlankRows++;
          continue;
        }
        // Blank lines count once data follows them, so a file's final line break never does.
        blankRows += pendingBlankRows;
        pendingBlankRows = 0;
        rowsRead++;
        pushRow(row, rowNumber, inputs);
      }
    },
    finish() {
      isFinished = true;
      if (inputs === null)
        throw new ImportError('no_header', 'the header row was never reached', { row: headerRow });
      if (rowsRead === 0) throw new ImportError('no_data', 'the file has no data rows');
      if (store.length === 0) {
        const first = problems[0];
        throw new ImportError('no_usable_rows', `none of the ${rowsRead} rows could be read`, {
          row: first?.row,
          column: first?.column,
        });
      }
      const arrays = store.toArrays();
      const log: Partial<Record<Channel, Float64Array>> = {};
      outputs.forEach((channel, k) => (log[channel] = arrays[k]));
      const dropped = droppedUnreadable + droppedTimeBack;
      const droppedFraction = dropped / rowsRead;
      return {
        log: { length: store.length, channels: log },
        problems: [...problems],
        stats: {
          rowsRead,
          rowsKept: store.length,
          rowsDroppedUnreadable: droppedUnreadable,
          rowsDroppedTimeBack: droppedTimeBack,
          blankRows,
          problemCount,
          droppedFraction,
          isMostlyBad: droppedFraction > mostlyBadFraction,
        },
      };
    },
  };
}
