/** The capacity the first append allocates, in samples per column. */
const INITIAL_CAPACITY = 4096;
/** Growth factor: 1.5 keeps the slack (and so the peak memory) below that of doubling. */
const GROWTH = 1.5;

/**
 * A fixed number of Float64 columns that grow together, geometrically, so appending millions
 * of samples costs amortised O(1) per value and about 8 bytes × columns × samples (up to 1.5×
 * while growing). No object is made per sample.
 */
export class GrowableColumns {
  /** How many samples each column holds. */
  length = 0;
  private capacity = 0;
  private columns: Float64Array[];

  constructor(count: number) {
    if (!Number.isInteger(count) || count < 0) {
      throw new Error('GrowableColumns: count must be a non-negative integer');
    }
    this.columns = Array.from({ length: count }, () => new Float64Array(0));
  }

  /** Appends one sample: `values[k]` goes to column k (values must hold one per column). */
  append(values: Float64Array): void {
    if (this.length === this.capacity) this.grow();
    const at = this.length;
    for (let k = 0; k < this.columns.length; k++) {
      (this.columns[k] as Float64Array)[at] = values[k] as number;
    }
    this.length++;
  }

  /** The last value of column k, or NaN when the columns are empty. */
  last(k: number): number {
    return this.length === 0 ? NaN : ((this.columns[k] as Float64Array)[this.length - 1] as number);
  }

  /** Tight copies of the columns (no spare capacity), safe to hand on or transfer. */
  toArrays(): Float64Array[] {
    return this.columns.map((column) => column.slice(0, this.length));
  }

  private grow(): void {
    this.capacity = Math.max(INITIAL_CAPACITY, Math.ceil(this.capacity * GROWTH));
    this.columns = this.columns.map((old) => {
      const next = new Float64Array(this.capacity);
      next.set(old.subarray(0, this.length));
      return next;
    });
  }
}
