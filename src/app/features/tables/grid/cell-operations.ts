import { type Grid } from '@shared/core/table';
// The guard's own file, not the `correct` index: the grid needs nothing else of it.
import { type LoadGuard, defaultLoadGuard, guardValuesUnderLoad } from '@shared/correct/load-guard';
import { fillGaps } from '@shared/fill/fill-gaps';
import { gaussianFilter } from '@shared/smooth/gaussian-filter';
import {
  type CellBounds,
  type CellPosition,
  type CellSet,
  boundsSize,
  cellKey,
} from './cell-range';
import type { CellChange } from './edit-history';
import { cellName } from './grid-model';
import { VE_RANGE } from './ve-input';

/** Which way "blend across" runs. */
export type BlendDirection = 'rows' | 'cols' | 'both';

/** An operation on the selected cells. */
export type CellOperation =
  | { readonly kind: 'scale'; readonly percent: number }
  | { readonly kind: 'offset'; readonly points: number }
  | { readonly kind: 'set'; readonly value: number }
  | { readonly kind: 'blend'; readonly direction: BlendDirection }
  | { readonly kind: 'smooth' }
  | { readonly kind: 'fillGaps' };

/** The table and selection an operation works on. Nothing here is mutated. */
export interface OperationInput {
  /** The VE values, `[row][col]`. */
  readonly values: readonly (readonly number[])[];
  /** The selected cells. */
  readonly bounds: CellBounds;
  /** Locked cells: never changed, but still read as context (edges, neighbours). */
  readonly locked: CellSet;
  /** RPM breakpoints (columns): blending runs linear in RPM, and messages name cells by them. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa (rows). */
  readonly mapAxisKpa: readonly number[];
  /**
   * The fuel-safety guard smooth and fill gaps run under (the analysis's, when one is shown);
   * default: the core's (90 % of standard barometric pressure, 1 %).
   */
  readonly guard?: LoadGuard;
}

/** The outcome of an operation: the new values and the cells that changed, or a refusal. */
export type OperationResult =
  | {
      readonly ok: true;
      /** The values after the operation (a new grid). */
      readonly values: number[][];
      /** The cells whose value changed, with their new value, row by row. */
      readonly changed: CellChange[];
      /** What was done, for the undo history ("Scale +5 %"). */
      readonly label: string;
      /** Cells under load the guard kept as they were (smooth and fill gaps only). */
      readonly held: CellPosition[];
      /** The guard that ran, null for an operation the user aims at values on purpose. */
      readonly guard: LoadGuard | null;
    }
  | { readonly ok: false; readonly message: string };

/** Gaussian standard deviation of "smooth", in cells: a light blur of the near neighbours. */
export const SMOOTH_SIGMA_CELLS = 1;
/** How far "smooth" moves a cell toward its neighbourhood's average (half-way). */
export const SMOOTH_STRENGTH = 0.5;

const NOTHING = 'Nothing changed.';
const MINUS = '\u2212';

/** "+5", "−2.5": a signed amount for labels. */
function signed(value: number): string {
  const text = String(Math.abs(Number(value.toFixed(4))));
  return value < 0 ? `${MINUS}${text}` : `+${text}`;
}

/** The label of an operation in the undo history and its messages. */
export function operationLabel(op: CellOperation): string {
  switch (op.kind) {
    case 'scale':
      return `Scale ${signed(op.percent)} %`;
    case 'offset':
      return `Offset ${signed(op.points)} VE`;
    case 'set':
      return `Set to ${Number(op.value.toFixed(4))}`;
    case 'blend':
      return { rows: 'Blend along rows', cols: 'Blend along columns', both: 'Blend across both' }[
        op.direction
      ];
    case 'smooth':
      return 'Smooth';
    case 'fillGaps':
      return 'Fill gaps';
  }
}

/** Why an amount typed for scale, offset or set cannot be used, or null. */
function amountProblem(op: CellOperation): string | null {
  const { min, max } = VE_RANGE;
  if (op.kind === 'scale' && !(Number.isFinite(op.percent) && op.percent > -100)) {
    return 'Type a scale in percent above −100 (5 scales by ×1.05).';
  }
  if (op.kind === 'offset' && !Number.isFinite(op.points)) {
    return 'Type how many VE points to add (negative to take away).';
  }
  if (op.kind === 'set' && !(op.value >= min && op.value <= max)) {
    return `Type a VE value between ${min} and ${max} % to set.`;
  }
  return null;
}

/** Why a blend cannot run on this selection, or null. */
function blendProblem(direction: BlendDirection, bounds: CellBounds): string | null {
  const { rows, cols } = boundsSize(bounds);
  const size = `The selection is ${rows} × ${cols}.`;
  if (direction === 'rows' && cols < 3) {
    return `Blending along rows needs at least 3 columns selected, so there is a cell between the left and right edges. ${size}`;
  }
  if (direction === 'cols' && rows < 3) {
    return `Blending along columns needs at least 3 rows selected, so there is a cell between the top and bottom edges. ${size}`;
  }
  if (direction === 'both' && (rows < 3 || cols < 3)) {
    return `Blending across both needs at least 3 rows and 3 columns selected. ${size}`;
  }
  return null;
}

/** Fraction 0..1 of `axis[i]` between `axis[lo]` and `axis[hi]`. */
function along(axis: readonly number[], lo: number, hi: number, i: number): number {
  return (axis[i] - axis[lo]) / (axis[hi] - axis[lo]);
}

/** The straight-line (or bilinear) value of a cell between the selection's edges. */
function blendValue(input: OperationInput, direction: BlendDirection, r: number, c: number) {
  const { values: v, bounds: b } = input;
  const t = along(input.rpmAxis, b.c0, b.c1, c);
  const u = along(input.mapAxisKpa, b.r0, b.r1, r);
  if (direction === 'rows') return v[r][b.c0] + t * (v[r][b.c1] - v[r][b.c0]);
  if (direction === 'cols') return v[b.r0][c] + u * (v[b.r1][c] - v[b.r0][c]);
  const top = v[b.r0][b.c0] + t * (v[b.r0][b.c1] - v[b.r0][b.c0]);
  const bottom = v[b.r1][b.c0] + t * (v[b.r1][b.c1] - v[b.r1][b.c0]);
  return top + u * (bottom - top);
}

/** The table as a Grid, with the cells `blank` returns true for set to NaN. */
function toGrid(values: readonly (readonly number[])[], blank: (r: number, c: number) => boolean) {
  const rows = values.length;
  const cols = values[0]?.length ?? 0;
  const data = new Float64Array(rows * cols);
  values.forEach((row, r) => row.forEach((v, c) => (data[r * cols + c] = blank(r, c) ? NaN : v)));
  return { rows, cols, data } satisfies Grid;
}

/**
 * Whether an operation guesses values (smooth, fill gaps), so the fuel-safety guard applies;
 * scale, offset, set and blend are values the user aims at on purpose and are not guarded.
 */
export function isGuardedOperation(op: CellOperation): boolean {
  return op.kind === 'smooth' || op.kind === 'fillGaps';
}

/**
 * What to tell the user about cells the guard held, or null when it held none: how many, why,
 * and how to change them on purpose.
 */
export function heldNote(held: readonly CellPosition[], guard: LoadGuard | null): string | null {
  if (!guard || held.length === 0) return null;
  const allowance = Number((guard.leanAllowance * 100).toFixed(2));
  const isOne = held.length === 1;
  const them = isOne ? 'it' : 'them';
  return (
    `Fuel-safety guard: ${isOne ? '1 cell' : `${held.length} cells`} under load kept ` +
    `${isOne ? 'its' : 'their'} value — the operation would have made ${them} more than ` +
    `${allowance} % leaner. Scale or set ${them} to change ${them} on purpose.`
  );
}

/**
 * The guard applied to the rounded results of a guessing operation: a free cell under load that
 * would go leaner than the allowance keeps its value in `next` (changed in place) and is listed.
 */
function holdUnderLoad(
  input: OperationInput,
  free: readonly CellPosition[],
  next: number[][],
  guard: LoadGuard,
): CellPosition[] {
  // No free cell under load: nothing to guard (and a one-row sketch of a table never reaches
  // the core's axis checks).
  if (!free.some(({ row }) => (input.mapAxisKpa[row] as number) >= guard.loadLineKpa)) return [];
  const cols = input.values[0]?.length ?? 0;
  const guarded = new Uint8Array(input.values.length * cols);
  for (const { row, col } of free) guarded[row * cols + col] = 1;
  const result = guardValuesUnderLoad(
    toGrid(input.values, () => false),
    toGrid(next, () => false),
    input.mapAxisKpa,
    guarded,
    guard,
  );
  const held: CellPosition[] = [];
  for (const cell of free) {
    if (!result.held[cell.row * cols + cell.col]) continue;
    next[cell.row][cell.col] = input.values[cell.row][cell.col];
    held.push(cell);
  }
  return held;
}

/** The free (selected, unlocked) cells of the input. */
function freeCells(input: OperationInput): CellPosition[] {
  const { bounds: b, locked } = input;
  const cells: CellPosition[] = [];
  for (let row = b.r0; row <= b.r1; row++)
    for (let col = b.c0; col <= b.c1; col++)
      if (!locked.has(cellKey(row, col))) cells.push({ row, col });
  return cells;
}

/** A function giving each free cell's new (unrounded) value, or a refusal. */
function newValueOf(
  input: OperationInput,
  op: CellOperation,
): ((cell: CellPosition) => number) | string {
  const v = input.values;
  switch (op.kind) {
    case 'scale':
      return ({ row, col }) => v[row][col] * (1 + op.percent / 100);
    case 'offset':
      return ({ row, col }) => v[row][col] + op.points;
    case 'set':
      return () => op.value;
    case 'blend':
      return ({ row, col }) => blendValue(input, op.direction, row, col);
    case 'smooth': {
      // The whole table is blurred, so unselected neighbours give the selected cells context.
      const blurred = gaussianFilter(
        toGrid(v, () => false),
        SMOOTH_SIGMA_CELLS,
      );
      const cols = blurred.cols;
      return ({ row, col }) => {
        const own = v[row][col];
        return own + SMOOTH_STRENGTH * (blurred.data[row * cols + col] - own);
      };
    }
    case 'fillGaps': {
      const isFree = new Set(freeCells(input).map(({ row, col }) => cellKey(row, col)));
      const filled = fillGaps(toGrid(v, (r, c) => isFree.has(cellKey(r, c))));
      const cols = filled.cols;
      const value = ({ row, col }: CellPosition) => filled.data[row * cols + col];
      if (freeCells(input).some((cell) => Number.isNaN(value(cell)))) {
        return 'Fill gaps fills the selection from the cells around it, and every cell is selected. Select fewer cells.';
      }
      return value;
    }
  }
}

/**
 * Runs `op` on the selected cells that are not locked, rounds the results to 0.01 as revisions
 * store them, and returns the new values with the cells that changed. Refuses, changing
 * nothing, when an amount is unusable, a blend lacks room, every selected cell is locked, or any
 * result would leave VE_RANGE (the message names the first such cell).
 *
 * - scale: v × (1 + percent/100); offset: v + points; set: the value.
 * - blend: straight lines between the selection's edge values, linear in the breakpoints
 *   (RPM along rows, kPa along columns) as the ECU interpolates; the edges stay. "both" is
 *   bilinear from the four corners, so the edges too become straight between the corners.
 * - smooth: each cell moves SMOOTH_STRENGTH of the way to a Gaussian (σ = SMOOTH_SIGMA_CELLS)
 *   average of the whole table, so unselected neighbours count as context.
 * - fill gaps: the cells are replaced by a harmonic fill (`fillGaps`) from the cells around them.
 *
 * Smooth and fill gaps guess values, so they run under the fuel-safety guard: a cell whose MAP
 * breakpoint is at or above the guard's load line keeps its value where the guess would make it
 * leaner than the allowance, and is listed in `held`. Scale, offset, set and blend are aimed at
 * on purpose and are not guarded.
 */
export function applyCellOperation(input: OperationInput, op: CellOperation): OperationResult {
  const label = operationLabel(op);
  const amount = amountProblem(op);
  if (amount) return { ok: false, message: `${amount} ${NOTHING}` };
  if (op.kind === 'blend') {
    const problem = blendProblem(op.direction, input.bounds);
    if (problem) return { ok: false, message: `${problem} ${NOTHING}` };
  }
  const free = freeCells(input);
  if (free.length === 0) {
    return { ok: false, message: `Every selected cell is locked. ${NOTHING}` };
  }
  const valueOf = newValueOf(input, op);
  if (typeof valueOf === 'string') return { ok: false, message: `${valueOf} ${NOTHING}` };
  const next = input.values.map((row) => [...row]);
  for (const cell of free) next[cell.row][cell.col] = Math.round(valueOf(cell) * 100) / 100;
  const guard = isGuardedOperation(op) ? (input.guard ?? defaultLoadGuard()) : null;
  const held = guard ? holdUnderLoad(input, free, next, guard) : [];
  const values = input.values.map((row) => [...row]);
  const changed: CellChange[] = [];
  const { min, max } = VE_RANGE;
  for (const cell of free) {
    const value = next[cell.row][cell.col];
    if (!(value >= min && value <= max)) {
      const name = cellName(input.rpmAxis, input.mapAxisKpa, cell.row, cell.col);
      const message = `${label} would take the ${name} to ${value} %, outside ${min}–${max} %. ${NOTHING}`;
      return { ok: false, message };
    }
    if (value !== values[cell.row][cell.col]) {
      values[cell.row][cell.col] = value;
      changed.push({ ...cell, value });
    }
  }
  return { ok: true, values, changed, label, held, guard };
}
