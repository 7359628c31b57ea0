/**
 * A VE table: rows follow `mapAxisKpa`, columns follow `rpmAxis` (both strictly ascending),
 * values in percent. `values[row][col]`.
 */
export interface VeTable {
  /** RPM breakpoints (columns), ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa absolute (rows), ascending. */
  readonly mapAxisKpa: readonly number[];
  /** VE in percent, `values[row][col]`. */
  readonly values: readonly (readonly number[])[];
}

/**
 * A rows × cols field of numbers stored row-major in a Float64Array (index = row * cols + col):
 * the working form of per-cell results inside the pipeline. NaN marks "no value".
 */
export interface Grid {
  /** Number of rows (MAP breakpoints). */
  readonly rows: number;
  /** Number of columns (RPM breakpoints). */
  readonly cols: number;
  /** Row-major values. */
  readonly data: Float64Array;
}

/** Throws unless `axis` is a non-empty, finite, strictly ascending list; `name` is in the error. */
export function validateAxis(axis: readonly number[], name: string): void {
  if (axis.length < 2) throw new Error(`${name} needs at least 2 breakpoints`);
  for (let i = 0; i < axis.length; i++) {
    const value = axis[i] as number;
    if (!Number.isFinite(value)) throw new Error(`${name}[${i}] is not a finite number`);
    if (i > 0 && value <= (axis[i - 1] as number)) {
      throw new Error(`${name} must be strictly ascending (at index ${i})`);
    }
  }
}

/** Throws unless the table's axes are valid and its values form a finite rows × cols grid. */
export function validateTable(table: VeTable, name = 'table'): void {
  validateAxis(table.rpmAxis, `${name}.rpmAxis`);
  validateAxis(table.mapAxisKpa, `${name}.mapAxisKpa`);
  if (table.values.length !== table.mapAxisKpa.length) {
    throw new Error(
      `${name}.values has ${table.values.length} rows, mapAxisKpa ${table.mapAxisKpa.length}`,
    );
  }
  table.values.forEach((row, r) => {
    if (row.length !== table.rpmAxis.length) {
      throw new Error(
        `${name}.values[${r}] has ${row.length} columns, rpmAxis ${table.rpmAxis.length}`,
      );
    }
    row.forEach((v, c) => {
      if (!Number.isFinite(v)) throw new Error(`${name}.values[${r}][${c}] is not a finite number`);
    });
  });
}

/** A grid of the given size filled with `fill`. */
export function createGrid(rows: number, cols: number, fill = 0): Grid {
  if (!Number.isInteger(rows) || rows < 1) throw new Error('rows must be a positive integer');
  if (!Number.isInteger(cols) || cols < 1) throw new Error('cols must be a positive integer');
  return { rows, cols, data: new Float64Array(rows * cols).fill(fill) };
}

/** The table's values as a grid (copied). */
export function tableToGrid(table: VeTable): Grid {
  const rows = table.mapAxisKpa.length;
  const cols = table.rpmAxis.length;
  const grid = createGrid(rows, cols);
  for (let r = 0; r < rows; r++) {
    const row = table.values[r] as readonly number[];
    for (let c = 0; c < cols; c++) grid.data[r * cols + c] = row[c] as number;
  }
  return grid;
}

/** A grid as nested arrays `[row][col]`. */
export function gridToRows(grid: Grid): number[][] {
  const out: number[][] = [];
  for (let r = 0; r < grid.rows; r++) {
    out.push(Array.from(grid.data.subarray(r * grid.cols, (r + 1) * grid.cols)));
  }
  return out;
}

/** A table with the same axes as `table` and the values of `grid`. */
export function withValues(table: VeTable, grid: Grid): VeTable {
  if (grid.rows !== table.mapAxisKpa.length || grid.cols !== table.rpmAxis.length) {
    throw new Error(
      `grid is ${grid.rows}×${grid.cols}, table ${table.mapAxisKpa.length}×${table.rpmAxis.length}`,
    );
  }
  return {
    rpmAxis: [...table.rpmAxis],
    mapAxisKpa: [...table.mapAxisKpa],
    values: gridToRows(grid),
  };
}

/** A grid as nested arrays for JSON: `[row][col]`, with null where the grid holds NaN. */
export function gridToJsonRows(grid: Grid): (number | null)[][] {
  return gridToRows(grid).map((row) => row.map((v) => (Number.isFinite(v) ? v : null)));
}

/** Nested `[row][col]` arrays (null for no value) as a grid; throws naming a ragged row. */
export function jsonRowsToGrid(rows: readonly (readonly (number | null)[])[], name = 'rows'): Grid {
  const cols = rows[0]?.length ?? 0;
  const grid = createGrid(rows.length, cols);
  rows.forEach((row, r) => {
    if (row.length !== cols)
      throw new Error(`${name}[${r}] has ${row.length} columns, expected ${cols}`);
    row.forEach((v, c) => {
      grid.data[r * cols + c] = v === null ? NaN : v;
    });
  });
  return grid;
}
