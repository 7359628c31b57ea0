import type { AnalysisRow } from '../../db/schema';
import type {
  AnalysisSummary,
  ApplyAnalysisRequest,
  CreateAnalysisRequest,
  ListAnalysesQuery,
} from '../../shared/contracts/analyses';
import type { AppliedGuard, AppliedRecord, Revision } from '../../shared/contracts/tables';
import type { Vehicle } from '../../shared/contracts/vehicles';
import type { VeTable } from '../../shared/core/table';
import { STANDARD_BARO_KPA } from '../../shared/correct';
import {
  analyseLogs,
  applyAnalysis,
  type AnalysisLog,
  type AnalysisSettings,
  type BaroEstimate,
} from '../../shared/pipeline';
import type { Database } from '../db';
import { AppError, conflict, notFound } from '../errors/app-error';
import { invalidInput } from '../errors/invalid-input';
import {
  findAnalysis,
  insertAnalysis,
  listAnalysesOfTable,
} from '../repositories/analyses.repository';
import { recordAudit } from '../repositories/audit.repository';
import { findLog } from '../repositories/logs.repository';
import { findRevision } from '../repositories/revisions.repository';
import { findTable } from '../repositories/tables.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { findVehicle } from '../repositories/vehicles.repository';
import {
  cellResults,
  storeAnalysis,
  storedEvidence,
  type CellResult,
  type StoredCells,
  type StoredProposal,
} from './analysis-json';
import { loadLogChannels } from './logs.service';
import { addRevision } from './revisions.service';

/** An analysis as the API answers it. */
export interface AnalysisResource {
  id: string;
  tableId: string;
  baseRevisionId: string;
  logIds: string[];
  settings: Record<string, unknown>;
  /** Per-cell results `[row][col]`. */
  cells: CellResult[][];
  /** Proposed VE `[row][col]` (null where the table has no value). */
  proposal: (number | null)[][];
  /** Per log: samples, kept, the filter funnel, the delay estimate and the delay used. */
  filterReport: Record<string, unknown>;
  /** Cells measured leaner than commanded under load, with their size. */
  leanFlags: unknown[];
  /**
   * The fuel-safety guard an apply of this analysis runs with by default: the vehicle's load line
   * and allowance over the barometric pressure the logs were recorded at.
   */
  guard: AppliedGuard;
  createdAt: string;
}

/** The barometric pressure an analysis stored; analyses from before it was kept assume ISA. */
function storedBaro(row: AnalysisRow): BaroEstimate {
  const baro = (row.filterReport as { baro?: BaroEstimate }).baro;
  return baro && baro.kpa > 0 ? baro : { kpa: STANDARD_BARO_KPA, source: 'assumed' };
}

/** The guard of an analysis on a vehicle: the vehicle's settings over the logs' pressure. */
function analysisGuard(row: AnalysisRow, vehicle: Vehicle): AppliedGuard {
  const baro = storedBaro(row);
  const { loadLinePercentOfBaro, leanAllowancePercent } = vehicle.fuelSafety;
  return {
    loadLineKpa: Math.round(baro.kpa * loadLinePercentOfBaro) / 100,
    loadLinePercentOfBaro,
    leanAllowancePercent,
    baroKpa: baro.kpa,
    baroSource: baro.source,
  };
}

/** The vehicle an analysis's table belongs to. */
async function vehicleOfTable(db: Database, shopId: string, tableId: string): Promise<Vehicle> {
  const table = await findTable(db, shopId, tableId);
  if (!table) throw notFound('Table');
  const vehicle = await findVehicle(db, shopId, table.vehicleId);
  if (!vehicle) throw notFound('Vehicle');
  return vehicle;
}

function toResource(row: AnalysisRow, vehicle: Vehicle): AnalysisResource {
  const cells = row.cells as unknown as StoredCells;
  const proposal = row.proposal as unknown as StoredProposal;
  return {
    id: row.id,
    tableId: row.tableId,
    baseRevisionId: row.baseRevisionId,
    logIds: row.logIds,
    settings: row.settings,
    cells: cellResults(cells, proposal),
    proposal: proposal.values,
    filterReport: row.filterReport,
    leanFlags: row.leanFlags,
    guard: analysisGuard(row, vehicle),
    createdAt: row.createdAt.toISOString(),
  };
}

/** The table of a revision as a VeTable, its axes from the revision's own table. */
async function revisionTable(db: Database, shopId: string, revision: Revision): Promise<VeTable> {
  const table = await findTable(db, shopId, revision.tableId);
  if (!table) throw notFound('Table');
  return { rpmAxis: table.rpmAxis, mapAxisKpa: table.mapAxisKpa, values: revision.values };
}

/**
 * Runs align → filter → accumulate → propose over parsed logs of the table's vehicle against a
 * base revision of the table, and stores everything it found. Each log's corrections are taken
 * relative to the revision its ECU ran (its `ecuRevisionId`, else the base).
 */
export async function createAnalysis(
  db: Database,
  actor: SessionUserRecord,
  tableId: string,
  body: CreateAnalysisRequest,
): Promise<AnalysisResource> {
  const table = await findTable(db, actor.shopId, tableId);
  if (!table) throw notFound('Table');
  const base = await findRevision(db, actor.shopId, body.baseRevisionId);
  if (!base) throw notFound('Base revision');
  if (base.tableId !== table.id) {
    throw conflict('baseRevisionId is a revision of another table', { baseRevisionId: base.id });
  }
  const vehicle = await findVehicle(db, actor.shopId, table.vehicleId);
  if (!vehicle) throw notFound('Vehicle');
  const baseTable: VeTable = {
    rpmAxis: table.rpmAxis,
    mapAxisKpa: table.mapAxisKpa,
    values: base.values,
  };

  const inputs: AnalysisLog[] = [];
  for (const logId of new Set(body.logIds)) {
    const log = await findLog(db, actor.shopId, logId);
    if (!log) throw notFound(`Log ${logId}`);
    if (log.vehicleId !== table.vehicleId) {
      throw conflict(`Log ${logId} belongs to another vehicle`, { logId });
    }
    let ecuTable: VeTable | undefined;
    if (log.ecuRevisionId && log.ecuRevisionId !== base.id) {
      const ran = await findRevision(db, actor.shopId, log.ecuRevisionId);
      if (ran) ecuTable = await revisionTable(db, actor.shopId, ran);
    }
    inputs.push({ log: await loadLogChannels(db, actor.shopId, logId), ecuTable });
  }

  const settings = (body.settings ?? {}) as AnalysisSettings;
  let analysis;
  try {
    analysis = analyseLogs(
      baseTable,
      inputs,
      { displacementL: vehicle.engine.displacementL },
      settings,
    );
  } catch (err) {
    // The user's filter expression is checked here, against the channels the logs have.
    throw new AppError(400, 'invalid_input', err instanceof Error ? err.message : String(err));
  }
  const stored = storeAnalysis(analysis);
  const logIds = [...new Set(body.logIds)];
  const filterReport = {
    logs: analysis.logs.map((contribution, i) => ({
      logId: logIds[i],
      samples: contribution.samples,
      kept: contribution.kept,
      funnel: contribution.funnel,
      delayUsed: contribution.delayUsed,
      delayEstimate: contribution.delayEstimate && {
        tau0S: contribution.delayEstimate.tau0S,
        kGrams: contribution.delayEstimate.kGrams,
        method: contribution.delayEstimate.method,
        quality: contribution.delayEstimate.quality,
        reason: contribution.delayEstimate.reason,
        events: contribution.delayEstimate.events.length,
      },
    })),
    samplesUsed: analysis.cells.samplesUsed,
    cellsTrusted: analysis.proposal.counts.trusted,
    baro: analysis.baro,
  };
  const row = await insertAnalysis(db, {
    shopId: actor.shopId,
    tableId: table.id,
    baseRevisionId: base.id,
    logIds,
    settings: body.settings ?? {},
    cells: stored.cells as unknown as Record<string, unknown>,
    proposal: stored.proposal as unknown as Record<string, unknown>,
    filterReport,
    leanFlags: [...analysis.leanFlags],
    createdBy: actor.id,
  });
  await recordAudit(db, {
    shopId: actor.shopId,
    actorId: actor.id,
    action: 'analysis.created',
    targetType: 'analysis',
    targetId: row.id,
    details: { tableId: table.id, baseRevisionId: base.id, logIds },
  });
  return toResource(row, vehicle);
}

/** One analysis of the actor's shop; 404 when it is not there. */
export async function getAnalysis(
  db: Database,
  actor: SessionUserRecord,
  id: string,
): Promise<AnalysisResource> {
  const row = await findAnalysis(db, actor.shopId, id);
  if (!row) throw notFound('Analysis');
  return toResource(row, await vehicleOfTable(db, actor.shopId, row.tableId));
}

/** A page of a table's analyses, newest first, without their grids; 404 without the table. */
export async function listAnalyses(
  db: Database,
  actor: SessionUserRecord,
  tableId: string,
  query: ListAnalysesQuery,
): Promise<{ items: AnalysisSummary[]; total: number }> {
  const table = await findTable(db, actor.shopId, tableId);
  if (!table) throw notFound('Table');
  return listAnalysesOfTable(db, actor.shopId, table.id, query);
}

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
  const settings = row.settings as AnalysisSettings;
  const guard = body.guard === false ? null : analysisGuard(row, vehicle);
  const step = body.stepFraction ?? 0.5;
  const smooth = body.smooth ?? DEFAULT_APPLY_SMOOTH;
  const applied = applyAnalysis(baseTable, storedEvidence(row.cells as unknown as StoredCells), {
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
