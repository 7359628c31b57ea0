import type { CellStats } from '../accumulate';
import { tableToGrid, validateTable, withValues, type Grid, type VeTable } from '../core/table';
import {
  defaultLoadGuard,
  guardUnderLoad,
  proposeTable,
  type LoadGuard,
  type Proposal,
} from '../correct';
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
  /**
   * The fuel-safety guard under load (see `guardUnderLoad`). Absent: on, with the line at 90 % of
   * standard barometric pressure and a 1 % allowance. `null` turns it off — an explicit choice
   * the caller must record.
   */
  readonly guard?: LoadGuard | null;
}

/**
 * How a cell of an applied table got its value: `measured` (trusted data), `filled` (a guess from
 * the neighbours or smoothing moved it), `held` (a guess under load would have leaned it: kept,
 * needs data), `locked`, or `unchanged` (no data and no guess, or outside the selection).
 */
export type CellOrigin = 'measured' | 'filled' | 'held' | 'locked' | 'unchanged';

/** The new table and how each cell got there. */
export interface AppliedTable {
  /** The new table (same axes as the base). */
  readonly table: VeTable;
  /** The ratio applied to each cell (new / base). */
  readonly ratio: Grid;
  /** The proposal before fill and smoothing. */
  readonly proposal: Proposal;
  /** How each cell got its value, row-major. */
  readonly origin: readonly CellOrigin[];
  /** Cells under load the guard held (row-major 0/1): they need data. */
  readonly held: Uint8Array;
  /** How many cells the guard held. */
  readonly heldCount: number;
  /** The guard that ran, or null when it was turned off. */
  readonly guard: LoadGuard | null;
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
  const guard = options.guard === undefined ? defaultLoadGuard() : options.guard;
  let held: Uint8Array = new Uint8Array(size);
  if (guard) {
    const guarded = guardUnderLoad(ratio, base.mapAxisKpa, proposal.known, guard);
    ratio = guarded.ratio;
    held = guarded.held;
  }
  const masked = new Float64Array(ratio.data);
  const origin: CellOrigin[] = new Array<CellOrigin>(size);
  let heldCount = 0;
  for (let i = 0; i < size; i++) {
    const isOutside = options.only !== undefined && !options.only[i];
    if (isOutside || (options.locked && options.locked[i])) {
      masked[i] = 1;
      held[i] = 0;
      origin[i] = isOutside ? 'unchanged' : 'locked';
    } else if (held[i]) {
      origin[i] = 'held';
      heldCount++;
    } else if (proposal.status[i] === 'trusted') {
      origin[i] = 'measured';
    } else {
      origin[i] = Math.abs((masked[i] as number) - 1) > 1e-12 ? 'filled' : 'unchanged';
    }
  }
  ratio = { rows: ratio.rows, cols: ratio.cols, data: masked };
  const values = applyRatios(baseGrid, ratio);
  return {
    table: withValues(base, values),
    ratio,
    proposal,
    origin,
    held,
    heldCount,
    guard: guard ?? null,
  };
}
