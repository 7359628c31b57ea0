import type { ApplyAnalysisRequest } from '../../shared/contracts/analyses';
import type { AppliedRecord, Revision } from '../../shared/contracts/tables';
import { applyAnalysis } from '../../shared/pipeline';
import type { Database } from '../db';
import { notFound } from '../errors/app-error';
import { invalidInput } from '../errors/invalid-input';
import { findAnalysis } from '../repositories/analyses.repository';
import { findRevision } from '../repositories/revisions.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { storedEvidence } from './analysis-json';
import { analysisGuard, revisionTable, vehicleOfTable } from './analysis-context';
import { addRevision } from './revisions.service';

/** A row-major mask of the cells listed as `[row, col]`; 400 naming a cell off the table. */
function cellMask(
  cells: readonly (readonly [number, number])[] | undefined,
  rows: number,
  cols: number,
  field: string,
): Uint8Array | undefined {
  if (!cells) return undefined;
  const mask = new Uint8Array(rows * cols);
  cells.forEach(([r, c], i) => {
    if (r >= rows || c >= cols) {
      throw invalidInput(
        `body.${field}.${i}`,
        `cell [${r}, ${c}] is outside the ${rows}×${cols} table`,
      );
    }
    mask[r * cols + c] = 1;
  });
  return mask;
}

/** VE rounded to hundredths: finer than any ECU table resolves, and stable to read. */
function roundVe(values: readonly (readonly number[])[]): number[][] {
  return values.map((row) => row.map((v) => Math.round(v * 100) / 100));
}

/**
 * Applies an analysis as a new draft revision whose parent is the analysis's base: the step
 * fraction, fill, smoothing, locked cells and an optional selection decide each cell, and the
 * fuel-safety guard (on unless the body says `guard: false`) holds guessed cells under load that
 * would go lean. The revision records how it was made, the held cells among it.
 */
export async function applyStoredAnalysis(
  db: Database,
  actor: SessionUserRecord,
  analysisId: string,
  body: ApplyAnalysisRequest,
): Promise<Revision> {
  const row = await findAnalysis(db, actor.shopId, analysisId);
  if (!row) throw notFound('Analysis');
  const base = await findRevision(db, actor.shopId, row.baseRevisionId);
  if (!base) throw notFound('Base revision');
  const baseTable = await revisionTable(db, actor.shopId, base);
  const vehicle = await vehicleOfTable(db, actor.shopId, row.tableId);
  const rows = baseTable.mapAxisKpa.length;
  const cols = baseTable.rpmAxis.length;
  const settings = row.settings;
  const guard = body.guard === false ? null : analysisGuard(row, vehicle);
  const step = body.stepFraction ?? 0.5;
  const smooth = body.smooth ?? DEFAULT_APPLY_SMOOTH;
  const applied = applyAnalysis(baseTable, storedEvidence(row.cells), {
    stepFraction: step,
    smooth,
    fill: body.fill,
    maxReach: body.maxReach,
    locked: cellMask(body.lockedCells, rows, cols, 'lockedCells'),
    only: cellMask(body.onlyCells, rows, cols, 'onlyCells'),
    maxStepPercent: settings.maxStepPercent,
    minWeight: settings.minWeight,
    maxSpread: settings.maxSpread,
    guard: guard && {
      loadLineKpa: guard.loadLineKpa,
      leanAllowance: guard.leanAllowancePercent / 100,
    },
  });
  const record = appliedRecord(row.id, applied, cols, {
    stepFraction: step,
    smooth,
    fill: body.fill !== false,
    maxReach: body.maxReach ?? null,
    selectedCells: body.onlyCells?.length ?? null,
    guard,
  });
  return addRevision(
    db,
    actor,
    base.tableId,
    {
      parentId: base.id,
      values: roundVe(applied.table.values),
      message: body.message ?? applyMessage(row.logIds.length, step, body, applied.heldCount),
    },
    { analysisId: row.id, applied: record },
  );
}

/** Smoothing strength of an apply that does not name one (as `applyAnalysis`). */
const DEFAULT_APPLY_SMOOTH = 0.3;

/** The default message of an applied revision: what, how far, and what the guard did. */
function applyMessage(
  logCount: number,
  step: number,
  body: ApplyAnalysisRequest,
  heldCount: number,
): string {
  const parts = [`Applied analysis of ${logCount} log(s) at step ${step}`];
  if (body.onlyCells) parts.push(` to ${body.onlyCells.length} selected cell(s)`);
  if (body.guard === false) parts.push('; fuel-safety guard under load turned OFF by the user');
  else if (heldCount > 0) parts.push(`; ${heldCount} cell(s) held under load: need data`);
  return parts.join('');
}

/** The record of how an apply made its revision. */
function appliedRecord(
  analysisId: string,
  applied: ReturnType<typeof applyAnalysis>,
  cols: number,
  how: Omit<AppliedRecord, 'analysisId' | 'heldCells' | 'counts' | 'origin'>,
): AppliedRecord {
  const counts = { measured: 0, filled: 0, held: 0, locked: 0, unchanged: 0 };
  const heldCells: [number, number][] = [];
  const origin: AppliedRecord['origin'] = [];
  applied.origin.forEach((kind, k) => {
    counts[kind]++;
    const r = Math.floor(k / cols);
    if (kind === 'held') heldCells.push([r, k - r * cols]);
    (origin[r] ??= []).push(kind);
  });
  return { analysisId, ...how, heldCells, counts, origin };
}
