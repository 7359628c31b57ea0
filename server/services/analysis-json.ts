import type { CellStats } from '../../shared/accumulate';
import type { AnalysisCell } from '../../shared/contracts/analyses';
import { gridToJsonRows, jsonRowsToGrid, type Grid } from '../../shared/core/table';
import type { Analysis } from '../../shared/pipeline';
import {
  type StoredCellGrid,
  type StoredCells,
  type StoredProposal,
} from '../repositories/stored-analysis';

export type { StoredCells, StoredProposal } from '../repositories/stored-analysis';

/** The results of one cell as the API shows them. */
export type CellResult = AnalysisCell;

/** Splits a row-major list into rows of `cols`. */
function toRows<T>(items: readonly T[], cols: number): T[][] {
  const rows: T[][] = [];
  for (let i = 0; i < items.length; i += cols) rows.push(items.slice(i, i + cols));
  return rows;
}

/** An analysis's per-cell grids and proposal in their stored JSON form. */
export function storeAnalysis(analysis: Analysis): {
  cells: StoredCells;
  proposal: StoredProposal;
} {
  const grid = (name: StoredCellGrid) => gridToJsonRows(analysis.cells[name]);
  const cells: StoredCells = {
    count: grid('count'),
    weight: grid('weight'),
    ratio: grid('ratio'),
    spread: grid('spread'),
    effectiveCount: grid('effectiveCount'),
    lambdaError: grid('lambdaError'),
    worstLean: grid('worstLean'),
    lambdaMeasured: grid('lambdaMeasured'),
    lambdaCommanded: grid('lambdaCommanded'),
  };
  const { proposal } = analysis;
  return {
    cells,
    proposal: {
      values: gridToJsonRows(proposal.values),
      ratio: gridToJsonRows(proposal.ratio),
      changePercent: gridToJsonRows(proposal.changePercent),
      status: toRows(proposal.status, proposal.values.cols),
    },
  };
}

/** A stored grid back as a Grid. */
export function storedGrid(cells: StoredCells, name: StoredCellGrid): Grid {
  return jsonRowsToGrid(cells[name], `cells.${name}`);
}

/** The evidence `applyAnalysis` needs, from the stored cells. */
export function storedEvidence(cells: StoredCells): Pick<CellStats, 'ratio' | 'weight' | 'spread'> {
  return {
    ratio: storedGrid(cells, 'ratio'),
    weight: storedGrid(cells, 'weight'),
    spread: storedGrid(cells, 'spread'),
  };
}

function pct(value: number | null | undefined): number | null {
  return value === null || value === undefined ? null : value * 100;
}

/** The per-cell results `[row][col]` as the API answers them. */
export function cellResults(cells: StoredCells, proposal: StoredProposal): CellResult[][] {
  return cells.weight.map((row, r) =>
    row.map((weight, c) => ({
      samples: cells.count[r]?.[c] ?? 0,
      weight: weight ?? 0,
      ratio: cells.ratio[r]?.[c] ?? null,
      spread: cells.spread[r]?.[c] ?? null,
      effectiveCount: cells.effectiveCount[r]?.[c] ?? 0,
      lambdaErrorPct: pct(cells.lambdaError[r]?.[c]),
      worstLeanPct: pct(cells.worstLean[r]?.[c]),
      lambdaMeasured: cells.lambdaMeasured[r]?.[c] ?? null,
      lambdaCommanded: cells.lambdaCommanded[r]?.[c] ?? null,
      proposal: proposal.values[r]?.[c] ?? null,
      changePct: proposal.changePercent[r]?.[c] ?? null,
      status: proposal.status[r]?.[c] ?? 'no_data',
    })),
  );
}
