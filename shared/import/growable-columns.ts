/** Rows in the first block; each next block doubles, up to the largest. */
const FIRST_BLOCK_ROWS = 256;
/** Rows in the largest block. */
const MAX_BLOCK_ROWS = 8192;

/**
 * A fixed number of Float64 columns that grow together by blocks, so appending millions of
 * samples costs O(1) per value and never copies what is stored: growing by reallocation would
 * copy every sample about twice and hold the old and new arrays (2.5× the data) at once. Blocks
 * hold whole rows, so that appending one is a single copy; the tight columns are assembled
 * once, at the end, block by block.
 */
export class GrowableColumns {
  /** How many samples each column holds. */
  length = 0;
  private blocks: Float64Array[] = [];
  private current = new Float64Array(0);
  /** Where the next row goes in the current block. */
  private at = 0;

  constructor(private readonly count: number) {
    if (!Number.isInteger(count) || count < 0) {
      throw new Error('GrowableColumns: count must be a non-negative integer');
    }
  }

  /** Appends one sample: `values[k]` goes to column k (values must hold one per column). */
  append(values: Float64Array): void {
    const { count } = this;
    if (this.at === this.current.length && count > 0) this.addBlock();
    // One native copy per row; writing sixteen columns one by one costs several times more.
    this.current.set(values.length === count ? values : values.subarray(0, count), this.at);
    this.at += count;
    this.length++;
  }

  /**
   * Tight arrays of the columns (no spare capacity, each its own buffer), safe to hand on or
   * transfer. Each block is let go once copied, so that the collector may free it while the
   * columns fill; the store ends empty.
   */
  takeArrays(): Float64Array[] {
    const { count, length } = this;
    const columns = Array.from({ length: count }, () => new Float64Array(length));
    let row = 0;
    for (let b = 0; b < this.blocks.length; b++) {
      const block = this.blocks[b] as Float64Array;
      const rows = Math.min(block.length / count, length - row);
      for (let k = 0; k < count; k++) {
        const column = columns[k] as Float64Array;
        for (let r = 0, j = k; r < rows; r++, j += count) column[row + r] = block[j] as number;
      }
      row += rows;
      this.blocks[b] = new Float64Array(0);
    }
    this.blocks = [];
    this.current = new Float64Array(0);
    this.at = 0;
    this.length = 0;
    return columns;
  }

  private addBlock(): void {
    // Small blocks first so that short logs stay small; big ones later to keep blocks few.
    const rows = this.current.length / this.count;
    const next = Math.min(MAX_BLOCK_ROWS, Math.max(FIRST_BLOCK_ROWS, 2 * rows));
    this.current = new Float64Array(next * this.count);
    this.blocks.push(this.current);
    this.at = 0;
  }
}
