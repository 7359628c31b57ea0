import { type CellStats } from '../accumulate/accumulate-cells';
import { validateGrid } from '../core/grid-checks';
import { validateAxis } from '../core/table';

const ROUNDING_PERCENT = 1e-9;

/** A cell that ran lean under load. */
export interface LeanFlag {
  /** Row (MAP breakpoint index). */
  readonly row: number;
  /** Column (RPM breakpoint index). */
  readonly col: number;
  /** The cell's RPM breakpoint. */
  readonly rpm: number;
  /** The cell's MAP breakpoint, kPa absolute. */
  readonly mapKpa: number;
  /** Weighted mean lambda error of the cell in % (positive = leaner than commanded). */
  readonly leanPercent: number;
  /** Worst single lean excursion under load in %, NaN when no sample under load touched it. */
  readonly worstLeanPercent: number;
  /** The cell's weight W, so a flag resting on one sample can be told apart. */
  readonly weight: number;
  /**
   * `abort` ("stop": stop loading the engine there until it is richer) at or beyond
   * `abortLeanPercent`, else `warn` ("warning": richen before the next full-load run) — both only
   * on a cell with the weight a proposal trusts. `watch`: as lean, but resting on too little data
   * to act on; log the cell again.
   */
  readonly severity: LeanSeverity;
}

/** How loudly a lean cell is shown; see `LeanFlag.severity`. */
export type LeanSeverity = 'watch' | 'warn' | 'abort';

/** Options of `flagLeanCells` (defaults are common practice, no published source). */
export interface LeanFlagOptions {
  /** Mean lean error above which a cell is flagged, %. Default 5. */
  readonly warnLeanPercent?: number;
  /** Lean error (mean or worst single excursion) at which the flag is 'abort', %. Default 10. */
  readonly abortLeanPercent?: number;
  /** Cells whose MAP breakpoint is at or above this count as under load, kPa. Default 90. */
  readonly minLoadKpa?: number;
  /**
   * Least weight W for a `warn` or `abort` flag: the weight a proposal needs to trust a cell
   * (default 5, as `proposeTable`). A lean cell below it is only a `watch`.
   */
  readonly minWeight?: number;
}

/** The per-cell evidence `flagLeanCells` reads (a `CellStats` fits). */
export type LeanEvidence = Pick<
  CellStats,
  'rpmAxis' | 'mapAxisKpa' | 'lambdaError' | 'worstLean' | 'weight'
>;

/**
 * The cells under load whose mean measured lambda is leaner than commanded by more than
 * `warnLeanPercent`, or where a single sample under load went `abortLeanPercent` lean — lean
 * mixture under load is what damages engines, so these are shown loudly. Sorted by severity
 * (abort, warn, watch), then leanest first.
 */
export function flagLeanCells(cells: LeanEvidence, options: LeanFlagOptions = {}): LeanFlag[] {
  validateAxis(cells.rpmAxis, 'cells.rpmAxis');
  validateAxis(cells.mapAxisKpa, 'cells.mapAxisKpa');
  const shape = { rows: cells.mapAxisKpa.length, cols: cells.rpmAxis.length };
  validateGrid(cells.lambdaError, 'cells.lambdaError', shape);
  validateGrid(cells.worstLean, 'cells.worstLean', shape);
  validateGrid(cells.weight, 'cells.weight', shape);
  const warn = options.warnLeanPercent ?? 5;
  const abort = options.abortLeanPercent ?? 10;
  const minLoadKpa = options.minLoadKpa ?? 90;
  if (!(warn >= 0) || !Number.isFinite(warn))
    throw new Error('options.warnLeanPercent must be ≥ 0');
  if (!(abort >= warn) || !Number.isFinite(abort)) {
    throw new Error('options.abortLeanPercent must be ≥ options.warnLeanPercent');
  }
  if (!Number.isFinite(minLoadKpa)) throw new Error('options.minLoadKpa must be a finite number');
  const minWeight = options.minWeight ?? 5;
  if (!(minWeight >= 0) || !Number.isFinite(minWeight)) {
    throw new Error('options.minWeight must be a finite number ≥ 0');
  }
  const flags: LeanFlag[] = [];
  for (let row = 0; row < shape.rows; row++) {
    const mapKpa = cells.mapAxisKpa[row] as number;
    if (mapKpa < minLoadKpa) continue;
    for (let col = 0; col < shape.cols; col++) {
      const k = row * shape.cols + col;
      const weight = cells.weight.data[k] as number;
      if (!(weight > 0)) continue;
      const leanPercent = (cells.lambdaError.data[k] as number) * 100;
      const worstLeanPercent = (cells.worstLean.data[k] as number) * 100;
      // Errors come from a division, so 0.88/0.8 lands a hair under 10 %: lean toward 'abort'.
      const worstIsAbort = worstLeanPercent >= abort - ROUNDING_PERCENT;
      if (!(leanPercent > warn) && !worstIsAbort) continue;
      const loud = leanPercent >= abort - ROUNDING_PERCENT || worstIsAbort ? 'abort' : 'warn';
      // A flag resting on a sliver of weight (a column the dyno never ran, touched by the edge
      // of one hold's interpolation) is not evidence enough to act on.
      const severity: LeanSeverity = weight >= minWeight ? loud : 'watch';
      const rpm = cells.rpmAxis[col] as number;
      flags.push({ row, col, rpm, mapKpa, leanPercent, worstLeanPercent, weight, severity });
    }
  }
  const rank: Record<LeanSeverity, number> = { abort: 0, warn: 1, watch: 2 };
  return flags.sort((a, b) => rank[a.severity] - rank[b.severity] || b.leanPercent - a.leanPercent);
}
