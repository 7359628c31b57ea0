import type { Channel } from '../core/channels';
import { flagFromWord } from './channel-converter';
import type { DecimalMark } from './column-mapping';
import { GrowableColumns } from './growable-columns';
import type { ImportProblem } from './log-build-result';
import type { LogInput } from './log-inputs';
import { parseDecimal } from './parse-decimal';

/** Options of {@link RowReader}. */
export interface RowReaderOptions {
  /** The decimal mark of numbers. */
  readonly decimal: DecimalMark;
  /** Barometric pressure (kPa) for gauge boost when no barometer value is there, else NaN. */
  readonly baroKpa: number;
  /** How many problems to keep in detail; all are counted. */
  readonly maxProblems: number;
}

/**
 * The row half of the log builder: reads the mapped cells of one data row into `values` (one
 * slot per channel read, in canonical units), reports what cannot be read, folds gauge boost
 * into MAP, drops rows that are unreadable or whose time goes back, and keeps the rest.
 */
export class RowReader {
  /** The row being read, one slot per channel read (the order of `channels`). */
  readonly values: Float64Array;
  /** The problems kept in detail, in file order. */
  readonly problems: ImportProblem[] = [];
  /** All problems found. */
  problemCount = 0;
  /** Rows dropped because a required value could not be read. */
  droppedUnreadable = 0;
  /** Rows dropped because their time went back. */
  droppedTimeBack = 0;
  private readonly store: GrowableColumns;
  private readonly timeSlot: number;
  private readonly boostSlot: number;
  private readonly baroSlot: number;
  /** Whether each slot is a flag or needs a unit conversion: its plain numbers need a look. */
  private needsLook = new Uint8Array(0);
  /** The slots whose `needsLook` is 1, in order. */
  private lookSlots = new Int32Array(0);
  /** The inputs `needsLook` was made for. */
  private lookedInputs: readonly LogInput[] = [];
  /** The time of the last sample kept (NaN before the first): time must not go back from it. */
  private lastTime = NaN;

  constructor(
    channels: readonly Channel[],
    private readonly options: RowReaderOptions,
  ) {
    this.values = new Float64Array(channels.length);
    this.store = new GrowableColumns(channels.length);
    this.timeSlot = channels.indexOf('time');
    this.boostSlot = channels.indexOf('boost');
    this.baroSlot = channels.indexOf('baro');
  }

  /** How many rows were kept. */
  get length(): number {
    return this.store.length;
  }

  /** Reads a row given as cell texts, with `inputs` in slot order. */
  readRow(row: readonly string[], rowNumber: number, inputs: readonly LogInput[]): void {
    let isReadable = true;
    for (let k = 0; k < inputs.length; k++) {
      // Every cell is read even after a failure so that each bad cell is reported.
      const input = inputs[k] as LogInput;
      if (!this.readCell(row[input.index] ?? '', rowNumber, k, input)) isReadable = false;
    }
    this.commit(rowNumber, inputs, isReadable);
  }

  /**
   * Reads a row whose plain numbers are already in `values` (NaN elsewhere), as a LineCells
   * scan of `text` leaves them with each slot's cell bounds; other cells are read as text.
   * `isPlain` says that no slot holds NaN.
   */
  readScanned(
    text: string,
    rowNumber: number,
    inputs: readonly LogInput[],
    scanned: { readonly starts: Int32Array; readonly ends: Int32Array; readonly isPlain: boolean },
  ): void {
    if (this.lookedInputs !== inputs) {
      this.needsLook = Uint8Array.from(inputs, (i) => (i.isFlag || !i.isIdentity ? 1 : 0));
      this.lookSlots = Int32Array.from(inputs.keys()).filter((k) => this.needsLook[k] === 1);
      this.lookedInputs = inputs;
    }
    const { values, needsLook, lookSlots } = this;
    const { starts, ends, isPlain } = scanned;
    // When every cell was a plain number, only flags and converted channels need a look.
    const count = isPlain ? lookSlots.length : values.length;
    let isReadable = true;
    for (let n = 0; n < count; n++) {
      const k = isPlain ? (lookSlots[n] as number) : n;
      const value = values[k];
      // A plain number in the canonical unit is already its value: the common case.
      if (needsLook[k] === 0 && !Number.isNaN(value)) continue;
      const input = inputs[k] as LogInput;
      let isRead: boolean;
      if (!Number.isNaN(value) && (!input.isFlag || value === 0 || value === 1)) {
        // A plain number is finite, so only a conversion can make it unreadable (φ = 0).
        const converted = input.convert(value);
        values[k] = converted;
        isRead = !(input.isRequired && !Number.isFinite(converted));
      } else isRead = this.readCell(text.slice(starts[k], ends[k]), rowNumber, k, input);
      if (!isRead) isReadable = false;
    }
    this.commit(rowNumber, inputs, isReadable);
  }

  /** Tight arrays of the kept rows, one per slot; empties the reader. */
  takeArrays(): Float64Array[] {
    return this.store.takeArrays();
  }

  private report(row: number, input: LogInput, message: string): void {
    this.problemCount++;
    if (this.problems.length < this.options.maxProblems) {
      this.problems.push({ row, column: input.column, channel: input.channel, message });
    }
  }

  /** Reads one cell's text into its slot; false when a required value is unreadable. */
  private readCell(text: string, rowNumber: number, slot: number, input: LogInput): boolean {
    let value = parseDecimal(text, this.options.decimal);
    if (input.isFlag && Number.isNaN(value)) value = flagFromWord(text);
    if (input.isFlag && value !== 0 && value !== 1 && !Number.isNaN(value)) {
      this.report(rowNumber, input, `flag is ${text.trim()}, not 0 or 1`);
      value = NaN;
    } else if (Number.isNaN(value)) {
      const isEmpty = text.trim() === '';
      // An empty optional cell is an unlogged sample, not a fault; garbage always is.
      if (!isEmpty || input.isRequired)
        this.report(rowNumber, input, isEmpty ? 'empty' : `not a number: "${text.trim()}"`);
    } else value = input.convert(value);
    this.values[slot] = value;
    return !(input.isRequired && !Number.isFinite(value));
  }

  /** Folds boost, checks time and keeps the row; counts it when it is dropped. */
  private commit(rowNumber: number, inputs: readonly LogInput[], isReadable: boolean): void {
    const { values, boostSlot, baroSlot, timeSlot } = this;
    if (isReadable && boostSlot >= 0) {
      const baro =
        baroSlot >= 0 && Number.isFinite(values[baroSlot])
          ? (values[baroSlot] as number)
          : this.options.baroKpa;
      values[boostSlot] = (values[boostSlot] as number) + baro;
      if (!Number.isFinite(values[boostSlot])) {
        this.report(rowNumber, inputs[baroSlot] as LogInput, 'no barometer for gauge boost');
        isReadable = false;
      }
    }
    if (!isReadable) {
      this.droppedUnreadable++;
      return;
    }
    const time = values[timeSlot] as number;
    if (time < this.lastTime) {
      const message = `time goes back from ${this.lastTime} s to ${time} s`;
      this.report(rowNumber, inputs[timeSlot] as LogInput, message);
      this.droppedTimeBack++;
      return;
    }
    this.lastTime = time;
    this.store.append(values);
  }
}
