import { validateGrid, validateMask } from '../core/grid-checks';
import { type Grid, validateAxis } from '../core/table';

/**
 * Sea-level standard pressure, kPa (U.S. Standard Atmosphere 1976 / ISA, reference.md §4 [S]):
 * the barometric pressure assumed when no log says otherwise.
 */
export const STANDARD_BARO_KPA = 101.325;

/**
 * Default load line as a fraction of barometric pressure: 0.9 puts wide-open throttle of an NA
 * engine and all boost above it, part-throttle cruise below (common practice, no published
 * source).
 */
export const DEFAULT_LOAD_LINE_FRACTION = 0.9;

/**
 * Default lean allowance of a guessed cell under load, as a fraction of its VE: 1 %, about the
 * accuracy of a wideband near λ = 1 (reference.md §7, common practice, no published source).
 */
export const DEFAULT_LEAN_ALLOWANCE = 0.01;

/**
 * The fuel-safety guard under load: a cell without trusted data whose MAP breakpoint is at or
 * above `loadLineKpa` may be made richer by a guess (fill, smoothing), but never leaner than its
 * base value by more than `leanAllowance`. Lean mixture under load is how engines are damaged,
 * and a guess must not remove fuel there: accuracy on average never outweighs this rule.
 */
export interface LoadGuard {
  /** MAP at or above which a cell counts as under load, kPa absolute. */
  readonly loadLineKpa: number;
  /** How much leaner than the base a guessed cell under load may become, fraction (0.01 = 1 %). */
  readonly leanAllowance: number;
}

/** The guard with the default line (90 % of `baroKpa`) and the default 1 % allowance. */
export function defaultLoadGuard(
  baroKpa: number = STANDARD_BARO_KPA,
  loadLineFraction: number = DEFAULT_LOAD_LINE_FRACTION,
  leanAllowance: number = DEFAULT_LEAN_ALLOWANCE,
): LoadGuard {
  if (!(baroKpa > 0) || !Number.isFinite(baroKpa)) throw new Error('baroKpa must be > 0');
  if (!(loadLineFraction > 0) || !(loadLineFraction <= 2)) {
    throw new Error('loadLineFraction must be in (0, 2]');
  }
  return { loadLineKpa: baroKpa * loadLineFraction, leanAllowance };
}

/** Checks a guard's figures; throws naming the bad one. */
export function validateLoadGuard(guard: LoadGuard): void {
  if (!Number.isFinite(guard.loadLineKpa) || !(guard.loadLineKpa >= 0)) {
    throw new Error('guard.loadLineKpa must be a finite number ≥ 0');
  }
  if (!(guard.leanAllowance >= 0) || !(guard.leanAllowance < 1)) {
    throw new Error('guard.leanAllowance must be within [0, 1)');
  }
}

/** What `guardUnderLoad` did. */
export interface GuardedRatios {
  /** The ratio field with every held cell set back to 1 (its base value). */
  readonly ratio: Grid;
  /** 1 where a guessed cell under load would have gone leaner than the allowance: held. */
  readonly held: Uint8Array;
  /** How many cells were held. */
  readonly heldCount: number;
}

/**
 * Holds guessed cells under load that a fill or smoothing wanted to lean out: where `settled[k]`
 * is 0 (no trusted data, not locked), the cell's MAP breakpoint is at or above the load line and
 * its ratio is below 1 − allowance, the ratio goes back to 1 — the base value is kept and the
 * cell is marked as needing data. A ratio within the allowance passes (it keeps the correction
 * continuous across the line where the fill leans a hair), and richer guesses always pass.
 * Holding at 1 rather than at the allowance means repeated rounds cannot walk a cell lean 1 % at
 * a time without a log ever measuring it.
 */
export function guardUnderLoad(
  ratio: Grid,
  mapAxisKpa: readonly number[],
  settled: Uint8Array,
  guard: LoadGuard,
): GuardedRatios {
  validateGrid(ratio, 'ratio');
  validateAxis(mapAxisKpa, 'mapAxisKpa');
  if (mapAxisKpa.length !== ratio.rows) {
    throw new Error(`mapAxisKpa has ${mapAxisKpa.length} breakpoints, the grid ${ratio.rows} rows`);
  }
  validateMask(settled, ratio.data.length, 'settled');
  validateLoadGuard(guard);
  const out = new Float64Array(ratio.data);
  const held = new Uint8Array(out.length);
  let heldCount = 0;
  const floor = 1 - guard.leanAllowance;
  for (let row = 0; row < ratio.rows; row++) {
    if ((mapAxisKpa[row] as number) < guard.loadLineKpa) continue;
    for (let col = 0; col < ratio.cols; col++) {
      const k = row * ratio.cols + col;
      if (settled[k] !== 0) continue;
      // NaN never reaches here from a fill, but a NaN must not slip past as "not leaner".
      if ((out[k] as number) >= floor) continue;
      out[k] = 1;
      held[k] = 1;
      heldCount++;
    }
  }
  return { ratio: { rows: ratio.rows, cols: ratio.cols, data: out }, held, heldCount };
}

/**
 * The same guard for values rather than ratios (the grid's own "fill gaps" and "smooth"):
 * a cell under load in `guarded` that `next` would make leaner than `current` by more than the
 * allowance keeps its current value and is reported. `guarded[k]` = 0 leaves a cell alone (a cell
 * the user chose to set, or one with trusted data behind it).
 */
export function guardValuesUnderLoad(
  current: Grid,
  next: Grid,
  mapAxisKpa: readonly number[],
  guarded: Uint8Array,
  guard: LoadGuard,
): { readonly values: Grid; readonly held: Uint8Array; readonly heldCount: number } {
  validateGrid(current, 'current');
  validateGrid(next, 'next', current);
  const ratio = new Float64Array(current.data.length);
  for (let k = 0; k < ratio.length; k++) {
    const before = current.data[k] as number;
    const after = next.data[k] as number;
    ratio[k] = before > 0 && Number.isFinite(before) && Number.isFinite(after) ? after / before : 1;
  }
  const settled = new Uint8Array(guarded.length);
  validateMask(guarded, ratio.length, 'guarded');
  for (let k = 0; k < settled.length; k++) settled[k] = guarded[k] === 0 ? 1 : 0;
  const result = guardUnderLoad(
    { rows: current.rows, cols: current.cols, data: ratio },
    mapAxisKpa,
    settled,
    guard,
  );
  const values = new Float64Array(next.data);
  result.held.forEach((isHeld, k) => {
    if (isHeld) values[k] = current.data[k] as number;
  });
  return {
    values: { rows: current.rows, cols: current.cols, data: values },
    held: result.held,
    heldCount: result.heldCount,
  };
}
