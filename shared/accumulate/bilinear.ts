import { locate } from '../core/lookup';
import { type Grid, type VeTable, validateAxis, validateTable } from '../core/table';
import { validateGrid } from '../core/grid-checks';

/** A grid together with the axes its rows (MAP) and columns (RPM) sit on. */
export interface GridOnAxes extends Grid {
  /** RPM breakpoints (columns), ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa absolute (rows), ascending. */
  readonly mapAxisKpa: readonly number[];
}

/**
 * The bilinear weights of the four cells around a position with fractions `fx` (along RPM) and
 * `fy` (along MAP), in the order [lower-left, next column, next row, diagonal] — i.e. cells
 * (row, col), (row, col+1), (row+1, col), (row+1, col+1). They sum to 1. The same weights serve
 * for reading a table (interpolation) and for spreading a sample over cells (splatting), which
 * is why a cell's data and the ECU's use of that cell line up.
 */
export function bilinearWeights(fx: number, fy: number): [number, number, number, number] {
  if (!(fx >= 0 && fx <= 1)) throw new Error('fx must be within [0, 1]');
  if (!(fy >= 0 && fy <= 1)) throw new Error('fy must be within [0, 1]');
  return [(1 - fx) * (1 - fy), fx * (1 - fy), (1 - fx) * fy, fx * fy];
}

function isGridOnAxes(source: VeTable | GridOnAxes): source is GridOnAxes {
  return 'data' in source;
}

/**
 * The value of a table (or a grid on axes) at (`rpm`, `mapKpa`) by bilinear interpolation, with
 * positions outside the axes clamped to the edge as the ECU does (no extrapolation).
 */
export function bilinearAt(source: VeTable | GridOnAxes, rpm: number, mapKpa: number): number {
  if (!Number.isFinite(rpm)) throw new Error('rpm must be a finite number');
  if (!Number.isFinite(mapKpa)) throw new Error('mapKpa must be a finite number');
  if (isGridOnAxes(source)) {
    validateAxis(source.rpmAxis, 'source.rpmAxis');
    validateAxis(source.mapAxisKpa, 'source.mapAxisKpa');
    validateGrid(source, 'source', { rows: source.mapAxisKpa.length, cols: source.rpmAxis.length });
    return interpolate(source.data, source.cols, source.rpmAxis, source.mapAxisKpa, rpm, mapKpa);
  }
  validateTable(source, 'source');
  const cols = source.rpmAxis.length;
  const flat = new Float64Array(source.mapAxisKpa.length * cols);
  source.values.forEach((row, r) => flat.set(row, r * cols));
  return interpolate(flat, cols, source.rpmAxis, source.mapAxisKpa, rpm, mapKpa);
}

function interpolate(
  data: Float64Array,
  cols: number,
  rpmAxis: readonly number[],
  mapAxisKpa: readonly number[],
  rpm: number,
  mapKpa: number,
): number {
  const px = locate(rpmAxis, rpm);
  const py = locate(mapAxisKpa, mapKpa);
  const k = py.i * cols + px.i;
  const [w00, w10, w01, w11] = bilinearWeights(px.f, py.f);
  return (
    w00 * (data[k] as number) +
    w10 * (data[k + 1] as number) +
    w01 * (data[k + cols] as number) +
    w11 * (data[k + cols + 1] as number)
  );
}

/**
 * The VE the ECU used at each sample: `table` read bilinearly at each (rpm, MAP). Feed it as
 * `veUsed` to `accumulateCells` when a log was recorded on a different revision than the one
 * being edited. Samples with a non-finite position get NaN (accumulateCells then skips them).
 */
export function veAtSamples(table: VeTable, rpm: Float64Array, mapKpa: Float64Array): Float64Array {
  validateTable(table, 'table');
  if (!(rpm instanceof Float64Array)) throw new Error('rpm must be a Float64Array');
  if (!(mapKpa instanceof Float64Array)) throw new Error('mapKpa must be a Float64Array');
  if (mapKpa.length !== rpm.length) {
    throw new Error(`mapKpa has ${mapKpa.length} samples, rpm ${rpm.length}`);
  }
  const cols = table.rpmAxis.length;
  const flat = new Float64Array(table.mapAxisKpa.length * cols);
  table.values.forEach((row, r) => flat.set(row, r * cols));
  const out = new Float64Array(rpm.length);
  for (let s = 0; s < rpm.length; s++) {
    const x = rpm[s] as number;
    const y = mapKpa[s] as number;
    out[s] =
      Number.isFinite(x) && Number.isFinite(y)
        ? interpolate(flat, cols, table.rpmAxis, table.mapAxisKpa, x, y)
        : NaN;
  }
  return out;
}
