import { validateGrid } from '../core/grid-checks';
import { type Grid } from '../core/table';
import { solveHarmonic } from './solve-harmonic';

/**
 * The grid's "fill gaps" operation: cells holding NaN get values by a harmonic (Laplace) fill
 * from the cells that hold one — each filled cell is the mean of its neighbours, so the fill is
 * as smooth as possible and stays within the range of the known values. A gap region with no
 * value on its border stays NaN. For correcting a table, fill the correction ratio instead
 * (`fillRatios`): filling VE values flattens the table's shape.
 */
export function fillGaps(values: Grid): Grid {
  validateGrid(values, 'values');
  const n = values.data.length;
  const fixed = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const v = values.data[k] as number;
    if (Number.isFinite(v)) fixed[k] = 1;
    else if (!Number.isNaN(v)) throw new Error(`values cell ${k} is infinite`);
  }
  const solved = solveHarmonic(values.data, fixed, values.rows, values.cols);
  return { rows: values.rows, cols: values.cols, data: solved.values };
}
