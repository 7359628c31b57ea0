import { validateGrid, validateMask } from '../core/grid-checks';
import { type Grid } from '../core/table';
import { normalizedConvolution } from './gaussian-filter';

/** Options of `smoothTable`. */
export interface SmoothOptions {
  /** Gaussian standard deviation in cells. Default 1. */
  readonly sigmaCells?: number;
  /** How far a cell with no confidence moves toward the smoothed value, 0..1. Default 0.5. */
  readonly strength?: number;
  /**
   * Confidence at which a cell moves half as far as one with none. Default 5, the default least
   * weight of a trusted cell in `proposeTable`, so a just-trusted cell keeps half its own value.
   */
  readonly halfConfidence?: number;
  /** Kernel cut-off in sigmas. Default 4 (as scipy). */
  readonly truncate?: number;
  /** Locked cells (non-zero), row-major: returned unchanged. */
  readonly locked?: Uint8Array;
}

/**
 * Confidence-weighted smoothing of a grid. With ŝ the normalized convolution of the grid with its
 * confidence (see `normalizedConvolution`), each cell becomes
 *
 *   out = v + strength · h/(c + h) · (ŝ − v),   h = halfConfidence,
 *
 * so a cell with no confidence moves `strength` of the way to its neighbourhood's confident
 * average, and a well-measured cell barely moves: smoothing may not overrule good data. Locked
 * cells, NaN cells and cells with no confident neighbour within reach are left as they are.
 * Works on any grid; on the correction-ratio field it keeps the base table's shape.
 */
export function smoothTable(grid: Grid, confidence: Grid, options: SmoothOptions = {}): Grid {
  validateGrid(grid, 'grid');
  validateGrid(confidence, 'confidence', grid);
  const strength = options.strength ?? 0.5;
  if (!(strength >= 0 && strength <= 1)) throw new Error('options.strength must be within [0, 1]');
  const half = options.halfConfidence ?? 5;
  if (!(half > 0) || !Number.isFinite(half)) {
    throw new Error('options.halfConfidence must be a finite number > 0');
  }
  const sigma = options.sigmaCells ?? 1;
  if (!(sigma > 0) || !Number.isFinite(sigma)) {
    throw new Error('options.sigmaCells must be a finite number > 0');
  }
  const n = grid.data.length;
  if (options.locked !== undefined) validateMask(options.locked, n, 'options.locked');
  const smoothed = normalizedConvolution(grid, confidence, sigma, options.truncate ?? 4).data;
  const out = new Float64Array(grid.data);
  for (let k = 0; k < n; k++) {
    if (options.locked !== undefined && options.locked[k] !== 0) continue;
    const v = grid.data[k] as number;
    const s = smoothed[k] as number;
    if (!Number.isFinite(v) || !Number.isFinite(s)) continue;
    const c = confidence.data[k] as number;
    out[k] = v + strength * (half / (c + half)) * (s - v);
  }
  return { rows: grid.rows, cols: grid.cols, data: out };
}
