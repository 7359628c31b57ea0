import { validateGrid, validateMask } from '../core/grid-checks';
import { type Grid, type VeTable } from '../core/table';
import { baseVeGrid } from '../correct/base-grid';
import { solveHarmonic } from './solve-harmonic';

/** Options of `fillRatios`. */
export interface FillRatiosOptions {
  /**
   * How many cells (steps between 4-neighbours) from the nearest known cell the fill may reach.
   * Cells beyond keep ratio 1 and hold the fill at 1 along that boundary, so the correction fades
   * out instead of ending in a step. Default: no limit.
   */
  readonly maxReach?: number;
}

/**
 * Distance of every cell from the nearest cell with `known[k]` ≠ 0, in steps between
 * 4-neighbours (breadth-first); Infinity when no cell is known.
 */
export function reachDistance(known: Uint8Array, rows: number, cols: number): Float64Array {
  validateMask(known, rows * cols, 'known');
  const dist = new Float64Array(rows * cols).fill(Infinity);
  const queue = new Int32Array(rows * cols);
  let head = 0;
  let tail = 0;
  for (let k = 0; k < known.length; k++) {
    if (known[k] !== 0) {
      dist[k] = 0;
      queue[tail++] = k;
    }
  }
  const reach = (q: number, d: number) => {
    if (d < (dist[q] as number)) {
      dist[q] = d;
      queue[tail++] = q;
    }
  };
  while (head < tail) {
    const k = queue[head++] as number;
    const r = Math.floor(k / cols);
    const c = k - r * cols;
    const next = (dist[k] as number) + 1;
    if (r > 0) reach(k - cols, next);
    if (r < rows - 1) reach(k + cols, next);
    if (c > 0) reach(k - 1, next);
    if (c < cols - 1) reach(k + 1, next);
  }
  return dist;
}

/**
 * Fills the correction-ratio field: cells with `known[k]` ≠ 0 (trusted or locked) keep their
 * ratio, every other cell within `maxReach` gets the harmonic (Laplace) fill of the known ratios,
 * and cells beyond reach — including regions with no known cell at all — get 1 (no change).
 * Fills the ratio, never VE values, so `applyRatios` keeps the base table's shape and only carries
 * the smooth error field over.
 */
export function fillRatios(ratio: Grid, known: Uint8Array, options: FillRatiosOptions = {}): Grid {
  validateGrid(ratio, 'ratio');
  const n = ratio.data.length;
  validateMask(known, n, 'known');
  const maxReach = options.maxReach ?? Infinity;
  if (!(maxReach >= 0) || !(Number.isInteger(maxReach) || maxReach === Infinity)) {
    throw new Error('options.maxReach must be a whole number ≥ 0 or Infinity');
  }
  const dist = reachDistance(known, ratio.rows, ratio.cols);
  const values = new Float64Array(n);
  const fixed = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    if (known[k] !== 0) {
      const r = ratio.data[k] as number;
      if (!(r > 0) || !Number.isFinite(r)) {
        throw new Error(`ratio cell ${k} is known but not a finite number > 0`);
      }
      values[k] = r;
      fixed[k] = 1;
    } else if (dist[k] === Infinity || (dist[k] as number) > maxReach) {
      values[k] = 1;
      fixed[k] = 1;
    }
  }
  const solved = solveHarmonic(values, fixed, ratio.rows, ratio.cols).values;
  // Every free region now borders a fixed cell (known, or ratio 1 beyond reach): no NaN left.
  return { rows: ratio.rows, cols: ratio.cols, data: solved };
}

/** base × ratio, cell by cell: the VE grid a filled (and smoothed) ratio field proposes. */
export function applyRatios(base: VeTable | Grid, ratios: Grid): Grid {
  const grid = baseVeGrid(base, 'base');
  validateGrid(ratios, 'ratios', grid);
  const out = new Float64Array(grid.data.length);
  for (let k = 0; k < out.length; k++) {
    const r = ratios.data[k] as number;
    if (!(r > 0) || !Number.isFinite(r)) throw new Error(`ratios cell ${k} must be finite and > 0`);
    out[k] = (grid.data[k] as number) * r;
  }
  return { rows: grid.rows, cols: grid.cols, data: out };
}
