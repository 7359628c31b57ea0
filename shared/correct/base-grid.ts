import { validateGrid } from '../core/grid-checks';
import { type Grid, tableToGrid, validateTable, type VeTable } from '../core/table';

/**
 * A base VE given as a table or a grid, as a grid (tables are copied; grids are returned as they
 * are, never written to). Throws, naming `name`, unless every value is finite and > 0: a ratio
 * applied to a zero or missing VE has no meaning.
 */
export function baseVeGrid(base: VeTable | Grid, name = 'base'): Grid {
  let grid: Grid;
  if ('data' in base) {
    validateGrid(base, name);
    grid = base;
  } else {
    validateTable(base, name);
    grid = tableToGrid(base);
  }
  for (let k = 0; k < grid.data.length; k++) {
    const v = grid.data[k] as number;
    if (!(v > 0) || !Number.isFinite(v)) {
      throw new Error(
        `${name} cell ${k} (row ${Math.floor(k / grid.cols)}) must be finite and > 0`,
      );
    }
  }
  return grid;
}
