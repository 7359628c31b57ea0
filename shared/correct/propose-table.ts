import { validateGrid, validateMask } from '../core/grid-checks';
import { type CellStats } from '../accumulate/accumulate-cells';
import { type Grid, type VeTable } from '../core/table';
import { baseVeGrid } from './base-grid';

/** How a cell was treated by `proposeTable`. */
export type CellStatus = 'trusted' | 'too_little_data' | 'locked' | 'no_data';

/** The per-cell evidence `proposeTable` needs (a `CellStats` fits). */
export type CellEvidence = Pick<CellStats, 'ratio' | 'weight' | 'spread'>;

/** Options of `proposeTable`. */
export interface ProposeOptions {
  /** Fraction of each correction applied this round, (0, 1]. Default 0.5 (common practice). */
  readonly stepFraction?: number;
  /** Largest change of one cell in one round, % of its VE. Default 15 (common practice). */
  readonly maxStepPercent?: number;
  /** Least weight W a cell needs to be trusted, in the unit of W. Default 5 (common practice). */
  readonly minWeight?: number;
  /** Largest spread of r (e.g. 0.03 = 3 %) a trusted cell may have. Default: no limit. */
  readonly maxSpread?: number;
  /** Cells the user locked (non-zero = locked), row-major; never changed. */
  readonly locked?: Uint8Array;
}

/** The result of `proposeTable`; grids are rows (MAP) × cols (RPM) like the base. */
export interface Proposal {
  /** Proposed VE: base × ratio. */
  readonly values: Grid;
  /** Applied ratio proposal/base: 1 wherever the cell is not trusted. Feed it to `fillRatios`. */
  readonly ratio: Grid;
  /** Applied change in % ((ratio − 1)·100), 0 where not trusted. */
  readonly changePercent: Grid;
  /** Per-cell status, row-major. */
  readonly status: readonly CellStatus[];
  /** 1 where the cell's ratio is settled (trusted or locked): the `known` mask of `fillRatios`. */
  readonly known: Uint8Array;
  /** 1 where the per-step limit cut the change. */
  readonly clamped: Uint8Array;
  /** How many cells have each status. */
  readonly counts: Readonly<Record<CellStatus, number>>;
}

function positive(value: number, name: string, max = Infinity): number {
  if (!(value > 0) || !(value <= max)) throw new Error(`${name} must be in (0, ${max}]`);
  return value;
}

/**
 * Proposes a new VE grid: base × (1 + step·(r − 1)) in every trusted cell, the change capped at
 * ±maxStepPercent, with r the cell's weighted mean correction. Cells with too little weight (or
 * too much spread, counted as too little consistent data) keep their VE, as do locked cells.
 */
export function proposeTable(
  base: VeTable | Grid,
  cells: CellEvidence,
  options: ProposeOptions = {},
): Proposal {
  const baseGrid = baseVeGrid(base, 'base');
  const shape = { rows: baseGrid.rows, cols: baseGrid.cols };
  validateGrid(cells.ratio, 'cells.ratio', shape);
  validateGrid(cells.weight, 'cells.weight', shape);
  validateGrid(cells.spread, 'cells.spread', shape);
  const step = positive(options.stepFraction ?? 0.5, 'options.stepFraction', 1);
  const maxStep = positive(options.maxStepPercent ?? 15, 'options.maxStepPercent', 100) / 100;
  const minWeight = options.minWeight ?? 5;
  if (!(minWeight >= 0) || !Number.isFinite(minWeight)) {
    throw new Error('options.minWeight must be a finite number ≥ 0');
  }
  const maxSpread = options.maxSpread ?? Infinity;
  if (!(maxSpread >= 0)) throw new Error('options.maxSpread must be ≥ 0');
  const n = baseGrid.data.length;
  if (options.locked !== undefined) validateMask(options.locked, n, 'options.locked');

  const values = new Float64Array(n);
  const ratio = new Float64Array(n).fill(1);
  const change = new Float64Array(n);
  const status: CellStatus[] = new Array<CellStatus>(n);
  const known = new Uint8Array(n);
  const clamped = new Uint8Array(n);
  const counts: Record<CellStatus, number> = {
    trusted: 0,
    too_little_data: 0,
    locked: 0,
    no_data: 0,
  };
  for (let k = 0; k < n; k++) {
    const ve = baseGrid.data[k] as number;
    const w = cells.weight.data[k] as number;
    const r = cells.ratio.data[k] as number;
    const sd = cells.spread.data[k] as number;
    let s: CellStatus;
    if (options.locked !== undefined && options.locked[k] !== 0) s = 'locked';
    else if (!(w > 0) || !Number.isFinite(r)) s = 'no_data';
    else if (w < minWeight || !(sd <= maxSpread)) s = 'too_little_data';
    else s = 'trusted';
    status[k] = s;
    counts[s]++;
    values[k] = ve;
    if (s === 'locked') known[k] = 1;
    if (s !== 'trusted') continue;
    known[k] = 1;
    let applied = 1 + step * (r - 1);
    if (applied > 1 + maxStep || applied < 1 - maxStep) {
      applied = Math.min(1 + maxStep, Math.max(1 - maxStep, applied));
      clamped[k] = 1;
    }
    ratio[k] = applied;
    change[k] = (applied - 1) * 100;
    values[k] = ve * applied;
  }
  const grid = (data: Float64Array): Grid => ({ rows: shape.rows, cols: shape.cols, data });
  return {
    values: grid(values),
    ratio: grid(ratio),
    changePercent: grid(change),
    status,
    known,
    clamped,
    counts,
  };
}
