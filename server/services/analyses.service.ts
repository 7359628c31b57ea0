import type {
  AnalysisResource,
  AnalysisSummary,
  CreateAnalysisRequest,
  FilterReport,
  ListAnalysesQuery,
} from '../../shared/contracts/analyses';
import type { Vehicle } from '../../shared/contracts/vehicles';
import type { VeTable } from '../../shared/core/table';
import { analyseLogs, type AnalysisLog, type AnalysisSettings } from '../../shared/pipeline';
import type { Database } from '../db';
import { AppError, conflict, notFound } from '../errors/app-error';
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
import { analysisGuard, revisionTable, vehicleOfTable } from './analysis-context';
import type { StoredAnalysis } from '../repositories/stored-analysis';
import { cellResults, storeAnalysis } from './analysis-json';

export type { AnalysisResource } from '../../shared/contracts/analyses';
import { loadLogChannels } from './logs.service';

function toResource(row: StoredAnalysis, vehicle: Vehicle): AnalysisResource {
  return {
    id: row.id,
    tableId: row.tableId,
    baseRevisionId: row.baseRevisionId,
    logIds: row.logIds,
    settings: row.settings,
    cells: cellResults(row.cells, row.proposal),
    proposal: row.proposal.values,
    filterReport: row.filterReport,
    leanFlags: row.leanFlags,
    guard: analysisGuard(row, vehicle),
    createdAt: row.createdAt.toISOString(),
  };
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
  const filterReport: FilterReport = {
    logs: analysis.logs.map((contribution, i) => ({
      logId: logIds[i] as string,
      samples: contribution.samples,
      kept: contribution.kept,
      funnel: contribution.funnel.map((line) => ({ ...line })),
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
    cells: stored.cells,
    proposal: stored.proposal,
    filterReport,
    leanFlags: analysis.leanFlags.map((flag) => ({
      ...flag,
      worstLeanPercent: Number.isNaN(flag.worstLeanPercent) ? null : flag.worstLeanPercent,
    })),
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
