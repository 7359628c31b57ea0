import { type Grid } from './table';

/**
 * Throws unless `grid` is a well-formed rows × cols grid (positive integer sizes, a Float64Array
 * of rows·cols values) and, when `shape` is given, has that shape. `name` is in every message.
 * Values are not checked here: NaN means "no value" in a grid, and callers say what they accept.
 */
export function validateGrid(
  grid: Grid,
  name: string,
  shape?: { readonly rows: number; readonly cols: number },
): void {
  if (grid === null || typeof grid !== 'object') throw new Error(`${name} must be a grid`);
  if (!Number.isInteger(grid.rows) || grid.rows < 1) {
    throw new Error(`${name}.rows must be a positive integer`);
  }
  if (!Number.isInteger(grid.cols) || grid.cols < 1) {
    throw new Error(`${name}.cols must be a positive integer`);
  }
  if (!(grid.data instanceof Float64Array)) throw new Error(`${name}.data must be a Float64Array`);
  if (grid.data.length !== grid.rows * grid.cols) {
    throw new Error(
      `${name}.data has ${grid.data.length} values, expected ${grid.rows * grid.cols}`,
    );
  }
  if (shape && (grid.rows !== shape.rows || grid.cols !== shape.cols)) {
    throw new Error(`${name} is ${grid.rows}×${grid.cols}, expected ${shape.rows}×${shape.cols}`);
  }
}

/** Throws unless `mask` is a Uint8Array of `length` entries (one per cell or sample). */
export function validateMask(mask: Uint8Array, length: number, name: string): void {
  if (!(mask instanceof Uint8Array)) throw new Error(`${name} must be a Uint8Array`);
  if (mask.length !== length) {
    throw new Error(`${name} has ${mask.length} entries, expected ${length}`);
  }
}
