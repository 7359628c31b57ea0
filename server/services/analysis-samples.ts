import { z } from 'zod';
import type { AnalysisSamples, AnalysisSamplesQuery } from '../../shared/contracts/analyses';
import { requireChannel, type ColumnarLog } from '../../shared/core/channels';
import type { VeTable } from '../../shared/core/table';
import { DEFAULT_FILTER_RULES, type FilterRule } from '../../shared/filter';
import { prepareLog, type AnalysisSettings } from '../../shared/pipeline';
import type { Database } from '../db';
import { conflict, notFound } from '../errors/app-error';
import { findAnalysis } from '../repositories/analyses.repository';
import { findLog } from '../repositories/logs.repository';
import { findRevision } from '../repositories/revisions.repository';
import { findTable } from '../repositories/tables.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { findVehicle } from '../repositories/vehicles.repository';
import { loadLogChannels } from './logs.service';

/** One log of an analysis, with what the analysis used to prepare it. */
export interface SampleLog {
  /** The log in canonical units. */
  readonly log: ColumnarLog;
  /** The table the ECU ran when the log was recorded; absent: the base table. */
  readonly ecuTable?: VeTable;
  /** The wideband delay the analysis applied to this log. */
  readonly delay: { readonly tau0S: number; readonly kGrams: number };
}

/** The kept samples of one log as columns of equal length. */
export interface KeptSamples {
  /** Engine speed. */
  readonly rpm: Float64Array;
  /** MAP, kPa absolute. */
  readonly mapKpa: Float64Array;
  /** λ_meas/λ_cmd − 1 in %, positive = lean (the sign of the cells' lambdaErrorPct). */
  readonly lambdaErrorPct: Float64Array;
}

/**
 * The samples of one log that an analysis kept, found again by the steps `analyseLogs` takes
 * before accumulating (`prepareLog`), with the delay the analysis used for this log. Samples the accumulation would skip
 * (a missing or non-positive lambda, speed or MAP, no VE) are left out as well, so what is
 * returned is exactly what was spread over the cells. Pure: the inputs are not changed.
 */
export function keptSamplesOfLog(
  base: VeTable,
  input: SampleLog,
  displacementL: number,
  rules: readonly FilterRule[],
): KeptSamples {
  const { log } = input;
  const rpm = requireChannel(log, 'rpm');
  const map = requireChannel(log, 'map');
  const { veUsed, aligned, keep } = prepareLog(log, {
    ecuTable: input.ecuTable ?? base,
    displacementL,
    delay: { ...input.delay, estimate: false },
    rules,
  });
  const lambda = requireChannel(aligned, 'lambda');
  const target = requireChannel(aligned, 'lambdaTarget');
  const stft = aligned.channels.stft;
  const ltft = aligned.channels.ltft;
  const picked: number[] = [];
  for (let s = 0; s < log.length; s++) {
    if (keep[s] === 0) continue;
    const lm = lambda[s] as number;
    const lc = target[s] as number;
    const ve = veUsed[s] as number;
    if (!(lm > 0 && lc > 0 && ve > 0 && Number.isFinite((rpm[s] as number) + (map[s] as number)))) {
      continue;
    }
    const st = stft?.[s] ?? 0;
    const lt = ltft?.[s] ?? 0;
    const trims =
      (1 + (Number.isFinite(st) ? st : 0) / 100) * (1 + (Number.isFinite(lt) ? lt : 0) / 100);
    if (!(trims > 0) || !Number.isFinite(lm / lc + ve)) continue;
    picked.push(s);
  }
  const out = {
    rpm: new Float64Array(picked.length),
    mapKpa: new Float64Array(picked.length),
    lambdaErrorPct: new Float64Array(picked.length),
  };
  picked.forEach((s, i) => {
    out.rpm[i] = rpm[s] as number;
    out.mapKpa[i] = map[s] as number;
    out.lambdaErrorPct[i] = ((lambda[s] as number) / (target[s] as number) - 1) * 100;
  });
  return out;
}

/**
 * Indices of an even stride through `total` items keeping at most `max` of them: all when they
 * fit, else ⌊i·total/max⌋ for i = 0…max−1. The same inputs always give the same indices, and a
 * stride keeps the samples' spread over time (a dyno hold keeps its share).
 */
export function evenStride(total: number, max: number): number[] {
  if (!Number.isInteger(total) || total < 0) throw new Error('evenStride: total must be ≥ 0');
  if (!Number.isInteger(max) || max < 1) throw new Error('evenStride: max must be ≥ 1');
  const n = Math.min(total, max);
  return Array.from({ length: n }, (_, i) => Math.floor((i * total) / n));
}

/** Rounds to `digits` decimals: finer than any sensor, and a smaller answer. */
function round(value: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
}

/** The part of the stored filter report this route needs: the delay used per log. */
const storedReportSchema = z.object({
  logs: z.array(
    z.object({
      logId: z.string(),
      delayUsed: z.object({ tau0S: z.number(), kGrams: z.number() }),
    }),
  ),
});

/**
 * The kept samples of an analysis's logs, evenly thinned to at most `query.max`: found again
 * from the stored logs with the analysis's own settings and per-log delay (nothing new is
 * stored). 404 when the analysis is not in the shop; 409 when one of its logs is gone or no
 * longer ready.
 */
export async function analysisSamples(
  db: Database,
  actor: SessionUserRecord,
  analysisId: string,
  query: AnalysisSamplesQuery,
): Promise<AnalysisSamples> {
  const row = await findAnalysis(db, actor.shopId, analysisId);
  if (!row) throw notFound('Analysis');
  const table = await findTable(db, actor.shopId, row.tableId);
  const base = await findRevision(db, actor.shopId, row.baseRevisionId);
  if (!table || !base) throw notFound('Analysis');
  const vehicle = await findVehicle(db, actor.shopId, table.vehicleId);
  if (!vehicle) throw notFound('Analysis');
  const baseTable: VeTable = {
    rpmAxis: table.rpmAxis,
    mapAxisKpa: table.mapAxisKpa,
    values: base.values,
  };
  const settings: AnalysisSettings = row.settings;
  const rules = settings.filters ?? DEFAULT_FILTER_RULES;
  const report = storedReportSchema.parse(row.filterReport);

  const perLog: KeptSamples[] = [];
  for (const logId of row.logIds) {
    const log = await findLog(db, actor.shopId, logId);
    if (!log) throw conflict(`Log ${logId} of this analysis is gone`, { logId });
    if (log.status !== 'ready') {
      throw conflict(`Log ${logId} of this analysis is ${log.status}, not ready`, {
        logId,
        status: log.status,
      });
    }
    const stored = report.logs.find((entry) => entry.logId === logId);
    if (!stored) throw new Error(`analysisSamples: the filter report has no log ${logId}`);
    // The same table choice as createAnalysis: the revision the ECU ran, when it is not the base.
    let ecuTable: VeTable | undefined;
    if (log.ecuRevisionId && log.ecuRevisionId !== base.id) {
      const ran = await findRevision(db, actor.shopId, log.ecuRevisionId);
      const ranTable = ran && (await findTable(db, actor.shopId, ran.tableId));
      if (ran && ranTable) {
        ecuTable = {
          rpmAxis: ranTable.rpmAxis,
          mapAxisKpa: ranTable.mapAxisKpa,
          values: ran.values,
        };
      }
    }
    const channels = await loadLogChannels(db, actor.shopId, logId);
    perLog.push(
      keptSamplesOfLog(
        baseTable,
        { log: channels, ecuTable, delay: stored.delayUsed },
        vehicle.engine.displacementL,
        rules,
      ),
    );
  }

  const total = perLog.reduce((n, part) => n + part.rpm.length, 0);
  const out: AnalysisSamples = {
    rpm: [],
    mapKpa: [],
    lambdaErrorPct: [],
    logIndex: [],
    total,
    returned: 0,
  };
  let logIndex = 0;
  let start = 0;
  for (const at of evenStride(total, query.max)) {
    while (at >= start + (perLog[logIndex]?.rpm.length ?? 0)) {
      start += perLog[logIndex]?.rpm.length ?? 0;
      logIndex++;
    }
    const part = perLog[logIndex] as KeptSamples;
    const i = at - start;
    out.rpm.push(round(part.rpm[i] as number, 1));
    out.mapKpa.push(round(part.mapKpa[i] as number, 2));
    out.lambdaErrorPct.push(round(part.lambdaErrorPct[i] as number, 3));
    out.logIndex.push(logIndex);
  }
  out.returned = out.rpm.length;
  return out;
}
