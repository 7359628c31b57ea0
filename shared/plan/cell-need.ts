/**
 * How much each cell needs data, and whether a session can reach it. Need combines missing
 * coverage, a wide spread and a large lambda error, scaled by importance (nearness to where the
 * engine has already run, and the cruising region where it spends most of its life).
 * Reachability is judged from the visited envelope: a boosted engine cannot reach high MAP at
 * low speed however the operator tries, and the cells it has reached mark what it can do.
 */
import { createGrid, type Grid } from '../core/table';
import { type PlanInput } from './plan-types';

/** Options of {@link cellNeed}. */
export interface CellNeedOptions {
  /** Weight at which a cell counts as covered; default 10. */
  minWeight?: number;
  /** Spread above which more data is needed; default 0.03. */
  spreadLimit?: number;
  /** Lambda error above which another look is needed; default 0.03. */
  lambdaErrorLimit?: number;
}

/** Lean error counts this much more than rich: lean under load damages engines. */
const LEAN_FACTOR = 1.5;

/**
 * Need per cell, ≥ 0 (0: nothing to gain): importance × (coverage + 0.7 · spread + error),
 * where coverage = 1 − min(1, weight / minWeight); spread and error terms are 0 inside their
 * limits and grow to 1 at twice (spread) or three times (error) the limit.
 */
export function cellNeed(input: PlanInput, options: CellNeedOptions = {}): Grid {
  const minWeight = options.minWeight ?? 10;
  const spreadLimit = options.spreadLimit ?? 0.03;
  const errorLimit = options.lambdaErrorLimit ?? 0.03;
  const { rows, cols } = input.weight;
  const distance = distanceToVisited(input.weight);
  const need = createGrid(rows, cols);
  for (let r = 0; r < rows; r++) {
    const map = input.mapAxisKpa[r] as number;
    for (let c = 0; c < cols; c++) {
      const rpm = input.rpmAxis[c] as number;
      const i = r * cols + c;
      const coverage = 1 - Math.min(1, Math.max(0, input.weight.data[i] as number) / minWeight);
      const spread = input.spread?.data[i] ?? Number.NaN;
      const spreadTerm = spread > spreadLimit ? Math.min(1, spread / (2 * spreadLimit)) : 0;
      const error = input.lambdaError?.data[i] ?? Number.NaN;
      const size = Math.abs(error) * (error > 0 ? LEAN_FACTOR : 1);
      const errorTerm = size > errorLimit ? Math.min(1, size / (3 * errorLimit)) : 0;
      const d = distance.data[i] as number;
      const near = d === 0 ? 1 : d === 1 ? 0.9 : d === 2 ? 0.6 : 0.3;
      const cruising = map >= 35 && map <= 85 && rpm >= 1500 && rpm <= 3500 ? 0.2 : 0;
      need.data[i] = Math.min(1, near + cruising) * (coverage + 0.7 * spreadTerm + errorTerm);
    }
  }
  return need;
}

/** Chebyshev distance in cells from each cell to the nearest visited one (Infinity if none). */
export function distanceToVisited(weight: Grid): Grid {
  const { rows, cols } = weight;
  const out = createGrid(rows, cols, Number.POSITIVE_INFINITY);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      if (!((weight.data[r * cols + c] as number) > 0)) continue;
      for (let rr = 0; rr < rows; rr++) {
        for (let cc = 0; cc < cols; cc++) {
          const d = Math.max(Math.abs(rr - r), Math.abs(cc - c));
          const k = rr * cols + cc;
          if (d < (out.data[k] as number)) out.data[k] = d;
        }
      }
    }
  }
  return out;
}

/**
 * The rows each column can reach: from the lowest to the highest visited row in that column and
 * its two neighbours, widened by `reachRows`. A column with no visited neighbour reaches every
 * row up to the barometric pressure (any engine can make its own intake pressure).
 */
export function reachableRows(
  input: PlanInput,
  reachRows: number,
  baroKpa: number,
): { low: number; high: number }[] {
  const { rows, cols } = input.weight;
  let baroRow = 0;
  input.mapAxisKpa.forEach((map, r) => {
    if (map <= baroKpa) baroRow = r;
  });
  const out: { low: number; high: number }[] = [];
  for (let c = 0; c < cols; c++) {
    let low = Number.POSITIVE_INFINITY;
    let high = Number.NEGATIVE_INFINITY;
    for (let cc = Math.max(0, c - 1); cc <= Math.min(cols - 1, c + 1); cc++) {
      for (let r = 0; r < rows; r++) {
        if ((input.weight.data[r * cols + cc] as number) > 0) {
          low = Math.min(low, r);
          high = Math.max(high, r);
        }
      }
    }
    out.push(
      Number.isFinite(low)
        ? { low: Math.max(0, low - reachRows), high: Math.min(rows - 1, high + reachRows) }
        : { low: 0, high: baroRow },
    );
  }
  return out;
}
