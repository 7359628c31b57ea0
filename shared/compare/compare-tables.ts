/**
 * The difference between two revisions of a table, as the revision comparison shows it: the
 * change of every cell (b − a) in VE points and in percent of `a`, and summary figures a
 * reviewer reads first.
 */
import { type VeTable, validateTable } from '../core/table';

/**
 * Smallest change in VE points that counts as a change. Tables are edited to a tenth or a
 * hundredth of a point; anything under half a hundredth is floating-point noise from the
 * arithmetic of a proposal, not an edit a reviewer should see.
 */
export const CHANGE_EPSILON_VE = 0.005;

/** Options of {@link compareTables}. */
export interface CompareOptions {
  /** Smallest |b − a| in VE points counted as changed; default {@link CHANGE_EPSILON_VE}. */
  epsilon?: number;
}

/** Summary figures of a comparison. */
export interface ComparisonSummary {
  /** Cells whose value moved by more than the epsilon. */
  readonly cellsChanged: number;
  /** Mean of |percent change| over the changed cells (0 when none changed), percent units. */
  readonly meanChangePct: number;
  /** Largest |percent change| of the changed cells (0 when none), percent units. */
  readonly maxChangePct: number;
  /** Changed cells whose VE went up: the ECU will inject more fuel there. */
  readonly richer: number;
  /** Changed cells whose VE went down: the ECU will inject less fuel there. */
  readonly leaner: number;
}

/** The result of {@link compareTables}, grids in table orientation (`[row][col]`). */
export interface TableComparison {
  /** b − a per cell, VE points. */
  readonly absolute: number[][];
  /** (b − a) / a · 100 per cell: percent of a, in percent units. */
  readonly percent: number[][];
  /** Summary figures. */
  readonly summary: ComparisonSummary;
}

function sameAxis(x: readonly number[], y: readonly number[]): boolean {
  return x.length === y.length && x.every((v, i) => v === y[i]);
}

/**
 * Compares revision `b` against revision `a` of the same table. Both must share their axes
 * (revisions of one table always do); VE in `a` must be positive so a percent change exists.
 * A cell is "changed" when |b − a| exceeds the epsilon; a higher VE makes the ECU estimate
 * more air and so inject more fuel, hence "richer".
 */
export function compareTables(
  a: VeTable,
  b: VeTable,
  options: CompareOptions = {},
): TableComparison {
  validateTable(a, 'compareTables: a');
  validateTable(b, 'compareTables: b');
  if (!sameAxis(a.rpmAxis, b.rpmAxis) || !sameAxis(a.mapAxisKpa, b.mapAxisKpa)) {
    throw new Error('compareTables: a and b must have the same rpmAxis and mapAxisKpa');
  }
  const epsilon = options.epsilon ?? CHANGE_EPSILON_VE;
  if (!Number.isFinite(epsilon) || epsilon < 0) {
    throw new Error('compareTables: options.epsilon must be a finite number of 0 or more');
  }
  const absolute: number[][] = [];
  const percent: number[][] = [];
  let cellsChanged = 0;
  let sumAbsPct = 0;
  let maxChangePct = 0;
  let richer = 0;
  let leaner = 0;
  a.values.forEach((rowA, r) => {
    const rowB = b.values[r] as readonly number[];
    const absRow: number[] = [];
    const pctRow: number[] = [];
    rowA.forEach((va, c) => {
      if (!(va > 0)) {
        throw new Error(`compareTables: a.values[${r}][${c}] must be greater than 0`);
      }
      const delta = (rowB[c] as number) - va;
      const pct = (delta / va) * 100;
      absRow.push(delta);
      pctRow.push(pct);
      if (Math.abs(delta) > epsilon) {
        cellsChanged++;
        maxChangePct = Math.max(maxChangePct, Math.abs(pct));
        sumAbsPct += Math.abs(pct);
        if (delta > 0) richer++;
        else leaner++;
      }
    });
    absolute.push(absRow);
    percent.push(pctRow);
  });
  return {
    absolute,
    percent,
    summary: {
      cellsChanged,
      meanChangePct: cellsChanged > 0 ? sumAbsPct / cellsChanged : 0,
      maxChangePct,
      richer,
      leaner,
    },
  };
}
