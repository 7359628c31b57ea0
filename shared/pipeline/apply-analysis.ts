import type { CellStats } from '../accumulate';
import { tableToGrid, validateTable, withValues, type Grid, type VeTable } from '../core/table';
import { proposeTable, type Proposal } from '../correct';
import { applyRatios, fillRatios } from '../fill';
import { smoothTable } from '../smooth';

/** How a proposal becomes a new table. */
export interface ApplyOptions {
  /** Fraction of each correction applied, (0, 1]. Default 0.5. */
  readonly stepFraction?: number;
  /** Largest change of a cell, %. Default 15. */
  readonly maxStepPercent?: number;
  /** Least weight before a cell is trusted. Default 5. */
  readonly minWeight?: number;
  /** Largest spread of a trusted cell. Default none. */
  readonly maxSpread?: number;
  /**
   * Smoothing strength 0–1 of the correction field (0: none). Default 0.3: enough to calm noisy,
   * thinly measured cells without moving well-measured ones much.
   */
  readonly smooth?: number;
  /** Smoothing radius, cells. Default 1. */
  readonly smoothSigmaCells?: number;
  /** Whether cells without trusted data get their correction from their neighbours. Default true. */
  readonly fill?: boolean;
  /** How many cells away from trusted data the fill reaches. Default: everywhere. */
  readonly maxReach?: number;
  /** Locked cells (non-zero), row-major: never changed. */
  readonly locked?: Uint8Array;
  /** Only these cells (non-zero) take the change; the rest keep the base value. Default all. */
  readonly only?: Uint8Array;
}

/** The new table and how each cell got there. */
export interface AppliedTable {
  /** The new table (same axes as the base). */
  readonly table: VeTable;
  /** The ratio applied to each cell (new / base). */
  readonly ratio: Grid;
  /** The proposal before fill and smoothing. */
  readonly proposal: Proposal;
}

/**
 * Turns the evidence of an analysis into a new table: propose at the chosen step, fill the
 * correction RATIO into cells without trusted data (never the VE values, which would flatten
 * the table's shape), smooth the ratio field weighted by confidence, and multiply the base by
 * it. Locked cells keep their value; with `only`, cells outside the selection keep theirs too.
 */
export function applyAnalysis(
  base: VeTable,
  cells: Pick<CellStats, 'ratio' | 'weight' | 'spread'>,
  options: ApplyOptions = {},
): AppliedTable {
  validateTable(base, 'base');
  const baseGrid = tableToGrid(base);
  const size = baseGrid.data.length;
  for (const [name, mask] of [
    ['locked', options.locked],
    ['only', options.only],
  ] as const) {
    if (mask && mask.length !== size) {
      throw new Error(`applyAnalysis: options.${name} has ${mask.length} cells, the table ${size}`);
    }
  }
  const proposal = proposeTable(baseGrid, cells, {
    stepFraction: options.stepFraction,
    maxStepPercent: options.maxStepPercent,
    minWeight: options.minWeight,
    maxSpread: options.maxSpread,
    locked: options.locked,
  });
  let ratio = proposal.ratio;
  if (options.fill !== false) {
    ratio = fillRatios(ratio, proposal.known, { maxReach: options.maxReach });
  }
  const strength = options.smooth ?? 0.3;
  if (strength > 0) {
    // A locked cell's ratio of 1 is the user's constraint, not evidence: it must not pull its
    // neighbours toward "no change", so it carries no confidence in the smoothing.
    const confidence = new Float64Array(cells.weight.data);
    if (options.locked) options.locked.forEach((isLocked, i) => isLocked && (confidence[i] = 0));
    ratio = smoothTable(
      ratio,
      { ...cells.weight, data: confidence },
      {
        strength,
        sigmaCells: options.smoothSigmaCells ?? 1,
        halfConfidence: options.minWeight ?? 5,
        locked: options.locked,
      },
    );
  }
  if (options.only || options.locked) {
    const masked = new Float64Array(ratio.data);
    for (let i = 0; i < size; i++) {
      if ((options.only && !options.only[i]) || (options.locked && options.locked[i]))
        masked[i] = 1;
    }
    ratio = { rows: ratio.rows, cols: ratio.cols, data: masked };
  }
  const values = applyRatios(baseGrid, ratio);
  return { table: withValues(base, values), ratio, proposal };
}
