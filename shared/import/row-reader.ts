import type { Channel } from '../core/channels';
import { flagFromWord } from './channel-converter';
import type { DecimalMark } from './column-mapping';
import { GrowableColumns } from './growable-columns';
import type { ImportProblem } from './log-build-result';
import type { LogInput } from './log-inputs';
import { parseDecimal } from './parse-decimal';
import {
  implausibleMessage,
  PLAUSIBLE_RANGES,
  plausibleBounds,
  type PlausibleRange,
} from './plausible-ranges';

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
 * into MAP, reports values outside their channel's {@link PLAUSIBLE_RANGES}, drops rows that are
 * unreadable, implausible or whose time goes back, and keeps the rest.
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
  /** Rows dropped because a value lay outside its channel's plausible range (none unreadable). */
  droppedImplausible = 0;
  private readonly store: GrowableColumns;
  private readonly timeSlot: number;
  private readonly boostSlot: number;
  private readonly baroSlot: number;
  /** The slots whose channel has a plausible range (boost: MAP's), and those ranges. */
  private readonly rangeSlots: Int32Array;
  private readonly slotRanges: readonly PlausibleRange[];
  /** Per entry of `rangeSlots`: its `plausibleBounds`, in typed arrays for the row loop. */
  private readonly lows: Float64Array;
  private readonly highs: Float64Array;
  private readonly isLowExclusive: Uint8Array;
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
    // Boost is checked once the barometer is added, as the absolute MAP it becomes.
    const ranges = channels.map((c) => PLAUSIBLE_RANGES[c === 'boost' ? 'map' : c]);
    this.rangeSlots = Int32Array.from(channels.keys()).filter((k) => ranges[k] !== undefined);
    this.slotRanges = ranges.filter((r): r is PlausibleRange => r !== undefined);
    const bounds = this.slotRanges.map(plausibleBounds);
    this.lows = Float64Array.from(bounds, (b) => b.low);
    this.highs = Float64Array.from(bounds, (b) => b.high);
    this.isLowExclusive = Uint8Array.from(bounds, (b) => (b.isLowExclusive ? 1 : 0));
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

  /**
   * Reports every value outside its channel's plausible range, skipping `skipSlot` (boost not
   * folded into MAP yet); false when there was one.
   */
  private checkRanges(rowNumber: number, inputs: readonly LogInput[], skipSlot: number): boolean {
    const { values, rangeSlots, lows, highs, isLowExclusive, boostSlot } = this;
    let isRowPlausible = true;
    for (let n = 0; n < rangeSlots.length; n++) {
      const k = rangeSlots[n] as number;
      const value = values[k] as number;
      const low = lows[n] as number;
      // As isPlausible, without a call per cell; NaN (a missing value) is never outside.
      const isOutside =
        value < low || value > (highs[n] as number) || (value === low && isLowExclusive[n] === 1);
      if (!isOutside || k === skipSlot) continue;
      isRowPlausible = false;
      const range = this.slotRanges[n] as PlausibleRange;
      const input = inputs[k] as LogInput;
      // Folded boost is named as the MAP it became, and reported at the boost column.
      const message =
        k === boostSlot
          ? implausibleMessage('map', value, range, 'boost + barometer')
          : implausibleMessage(
              input.channel,
              value,
              range,
              input.isIdentity ? undefined : 'after unit conversion',
            );
      this.report(rowNumber, input, message);
    }
    return isRowPlausible;
  }

  /**
   * Folds boost, checks the ranges and time, and keeps the row; counts it when it is dropped. A
   * row both unreadable and implausible has each problem reported but counts as unreadable.
   */
  private commit(rowNumber: number, inputs: readonly LogInput[], isReadable: boolean): void {
    const { values, boostSlot, baroSlot, timeSlot } = this;
    // Boost only becomes MAP when the row is readable; before that it is not checked.
    const unfoldedSlot = isReadable ? -1 : boostSlot;
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
    // Checked on unreadable rows too, so that every bad cell of a row is reported at once.
    const isRowPlausible = this.checkRanges(rowNumber, inputs, unfoldedSlot);
    if (!isReadable) {
      this.droppedUnreadable++;
      return;
    }
    if (!isRowPlausible) {
      this.droppedImplausible++;
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
