import type { AnalysisCell } from '@shared/contracts/analyses';
import type { AppliedGuard } from '@shared/contracts/tables';
import { type Grid, createGrid, type VeTable } from '@shared/core/table';
import type { LoadGuard } from '@shared/correct/load-guard';
import { type CellOrigin, applyAnalysis } from '@shared/pipeline/apply-analysis';

export type { CellOrigin } from '@shared/pipeline/apply-analysis';

/** A cell as `[row, col]`. */
export type CellRef = readonly [number, number];

/** The part of a cell's evidence the apply step reads (what the server stores and re-reads). */
export type PreviewEvidenceCell = Pick<AnalysisCell, 'weight' | 'ratio' | 'spread'>;

/** The figures of an analysis's fuel-safety guard the apply reads (as the API answers them). */
export type PreviewGuard = Pick<AppliedGuard, 'loadLineKpa' | 'leanAllowancePercent'>;

/** The analysis settings the server's apply takes from the stored analysis. */
export interface PreviewAnalysisSettings {
  /** Largest change of a cell, %. */
  readonly maxStepPercent?: number;
  /** Least weight before a cell is trusted. */
  readonly minWeight?: number;
  /** Largest spread of a trusted cell. */
  readonly maxSpread?: number;
  /**
   * The analysis's fuel-safety guard (its `guard`); absent: the core's default guard, as an
   * apply without one.
   */
  readonly guard?: PreviewGuard;
}

/** The apply options the user picks, as `POST /api/analyses/:id/apply` takes them. */
export interface PreviewApplyOptions {
  /** Fraction of the correction applied, (0, 1]. */
  readonly stepFraction?: number;
  /** Smoothing strength 0–1. */
  readonly smooth?: number;
  /** Whether cells without trusted data take their neighbours' correction. */
  readonly fill?: boolean;
  /** How far the fill reaches, cells (absent: everywhere). */
  readonly maxReach?: number;
  /** Cells that keep their base value. */
  readonly lockedCells?: readonly CellRef[];
  /** Only these cells change (absent: all cells). */
  readonly onlyCells?: readonly CellRef[];
  /** `false`: the user turned the fuel-safety guard off; absent or true: on. */
  readonly guard?: boolean;
}

/** Everything a preview is computed from; plain arrays, so it can be posted to a worker. */
export interface PreviewInput {
  /** RPM breakpoints of the table (columns). */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints of the table, kPa (rows). */
  readonly mapAxisKpa: readonly number[];
  /** VE of the analysed base revision, `[row][col]`. */
  readonly baseValues: readonly (readonly number[])[];
  /** The analysis's per-cell evidence, `[row][col]`. */
  readonly cells: readonly (readonly PreviewEvidenceCell[])[];
  /** The analysis's own settings. */
  readonly settings: PreviewAnalysisSettings;
  /** What the user picked. */
  readonly apply: PreviewApplyOptions;
}

/** A message to the preview worker: one preview to compute, tagged with its request id. */
export interface PreviewWorkerRequest {
  /** Grows with every request; answers to older ids are dropped. */
  readonly id: number;
  /** What to compute. */
  readonly input: PreviewInput;
}

/** What applying would write, and how each cell got there. */
export interface PreviewResult {
  /** The VE the server would store, rounded to 0.01, `[row][col]`. */
  readonly values: number[][];
  /** How each cell got its value (measured, filled, held, locked, unchanged), `[row][col]`. */
  readonly origin: CellOrigin[][];
  /** How many cells under load the guard held: they need data. */
  readonly heldCount: number;
  /** The guard that ran, null when the user turned it off. */
  readonly guard: LoadGuard | null;
}

/** The worker's answer: the preview, or the sentence the core threw. */
export type PreviewWorkerReply =
  ({ readonly id: number } & PreviewResult) | { readonly id: number; readonly error: string };

/** How a preview differs from its base. */
export interface PreviewSummary {
  /** Cells whose value changes. */
  readonly changed: number;
  /** Mean change of the changed cells, % (positive: VE up), 0 when none changed. */
  readonly meanChangePct: number;
  /** The change of largest size, % with its sign, 0 when none changed. */
  readonly largestChangePct: number;
  /** Where the largest change is, null when none changed. */
  readonly largestAt: CellRef | null;
  /** Cells whose VE goes up (more fuel: richer). */
  readonly richer: number;
  /** Cells whose VE goes down (less fuel: leaner). */
  readonly leaner: number;
}

/**
 * The evidence grids `applyAnalysis` reads, from the analysis cells as the API answers them:
 * a null ratio or spread becomes NaN ("no value"), exactly as the server turns its stored JSON
 * back into grids before it applies.
 */
export function evidenceGrids(cells: readonly (readonly PreviewEvidenceCell[])[]): {
  ratio: Grid;
  weight: Grid;
  spread: Grid;
} {
  const rows = cells.length;
  const cols = cells[0]?.length ?? 0;
  const ratio = createGrid(rows, cols);
  const weight = createGrid(rows, cols);
  const spread = createGrid(rows, cols);
  cells.forEach((row, r) => {
    if (row.length !== cols) {
      throw new Error(`analysis cells row ${r} has ${row.length} columns, expected ${cols}`);
    }
    row.forEach((cell, c) => {
      const i = r * cols + c;
      ratio.data[i] = cell.ratio ?? NaN;
      weight.data[i] = cell.weight;
      spread.data[i] = cell.spread ?? NaN;
    });
  });
  return { ratio, weight, spread };
}

/**
 * A row-major mask with 1 at each listed cell; undefined when there is no list. Throws naming
 * a cell off the table, as the server refuses one.
 */
export function cellMask(
  cells: readonly CellRef[] | undefined,
  rows: number,
  cols: number,
  name: string,
): Uint8Array | undefined {
  if (!cells) return undefined;
  const mask = new Uint8Array(rows * cols);
  for (const [r, c] of cells) {
    if (!Number.isInteger(r) || !Number.isInteger(c) || r < 0 || c < 0 || r >= rows || c >= cols) {
      throw new Error(`${name}: cell [${r}, ${c}] is outside the ${rows}×${cols} table`);
    }
    mask[r * cols + c] = 1;
  }
  return mask;
}

/** VE rounded to hundredths, as the server stores an applied revision. */
export function roundVe(values: readonly (readonly number[])[]): number[][] {
  return values.map((row) => row.map((v) => Math.round(v * 100) / 100));
}

/**
 * The core's guard for an apply, mapped as the server's apply maps it: off (null) when the user
 * turned it off, else the analysis's load line with its allowance as a fraction, or undefined
 * (the core's default guard) when the analysis names none.
 */
export function loadGuardOf(
  guard: PreviewGuard | undefined,
  isOn: boolean | undefined,
): LoadGuard | null | undefined {
  if (isOn === false) return null;
  if (!guard) return undefined;
  return { loadLineKpa: guard.loadLineKpa, leanAllowance: guard.leanAllowancePercent / 100 };
}

/** A row-major list as `[row][col]`. */
function toRows<T>(list: readonly T[], rows: number, cols: number): T[][] {
  return Array.from({ length: rows }, (_, r) => list.slice(r * cols, (r + 1) * cols));
}

/**
 * What the server would store if the analysis were applied with these options: the same
 * `applyAnalysis` of the shared core, the same evidence, the analysis's own maxStepPercent,
 * minWeight, maxSpread and fuel-safety guard, the same masks and the same rounding to 0.01; with
 * how each cell got its value.
 */
export function computeProposalPreview(input: PreviewInput): PreviewResult {
  const base: VeTable = {
    rpmAxis: input.rpmAxis,
    mapAxisKpa: input.mapAxisKpa,
    values: input.baseValues,
  };
  const rows = input.mapAxisKpa.length;
  const cols = input.rpmAxis.length;
  const { apply, settings } = input;
  const applied = applyAnalysis(base, evidenceGrids(input.cells), {
    stepFraction: apply.stepFraction,
    smooth: apply.smooth,
    fill: apply.fill,
    maxReach: apply.maxReach,
    locked: cellMask(apply.lockedCells, rows, cols, 'lockedCells'),
    only: cellMask(apply.onlyCells, rows, cols, 'onlyCells'),
    maxStepPercent: settings.maxStepPercent,
    minWeight: settings.minWeight,
    maxSpread: settings.maxSpread,
    guard: loadGuardOf(settings.guard, apply.guard),
  });
  return {
    values: roundVe(applied.table.values),
    origin: toRows(applied.origin, rows, cols),
    heldCount: applied.heldCount,
    guard: applied.guard,
  };
}

/** How many cells got their value each way. */
export type OriginCounts = Readonly<Record<CellOrigin, number>>;

/** The cells of a preview counted by how they got their value. */
export function countOrigins(origin: readonly (readonly CellOrigin[])[]): OriginCounts {
  const counts: Record<CellOrigin, number> = {
    measured: 0,
    filled: 0,
    held: 0,
    locked: 0,
    unchanged: 0,
  };
  for (const row of origin) for (const kind of row) counts[kind]++;
  return counts;
}

/** Counts and sizes of the changes from `base` to `preview` (same shape). */
export function summarisePreview(
  base: readonly (readonly number[])[],
  preview: readonly (readonly number[])[],
): PreviewSummary {
  let changed = 0;
  let sum = 0;
  let largest = 0;
  let largestAt: CellRef | null = null;
  let richer = 0;
  let leaner = 0;
  for (let r = 0; r < preview.length; r++) {
    const row = preview[r] as readonly number[];
    for (let c = 0; c < row.length; c++) {
      const before = base[r]?.[c];
      const after = row[c] as number;
      if (before === undefined || after === before) continue;
      // A base of 0 cannot occur in a valid table (VE ≥ 1 %); guard the division anyway.
      const pct = before !== 0 ? (100 * (after - before)) / before : 0;
      changed++;
      sum += pct;
      if (after > before) richer++;
      else leaner++;
      if (Math.abs(pct) > Math.abs(largest)) {
        largest = pct;
        largestAt = [r, c];
      }
    }
  }
  return {
    changed,
    meanChangePct: changed > 0 ? sum / changed : 0,
    largestChangePct: largest,
    largestAt,
    richer,
    leaner,
  };
}
