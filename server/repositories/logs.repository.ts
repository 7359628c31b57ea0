import { and, desc, eq, inArray } from 'drizzle-orm';
import { logChannels, logs, vehicles, type LogRow } from '../../db/schema';
import {
  columnMappingSchema,
  logErrorSchema,
  logSchema,
  parseReportSchema,
  type LogError,
  type LogKind,
  type LogResource,
  type LogStatus,
  type ParseReport,
} from '../../shared/contracts/logs';
import type { ColumnMapping } from '../../shared/import';
import type { Executor } from '../db';

/** A JSON copy of a value for a jsonb column (NaN and Infinity become null, as in JSON). */
function asJson(value: object): Record<string, unknown> {
  return JSON.parse(JSON.stringify(value)) as Record<string, unknown>;
}

// The jsonb columns are typed loosely in the schema: they are parsed once here, by the same
// contracts the API answers with, so a row that drifted fails loudly instead of travelling on.
function toLog(row: LogRow): LogResource {
  return {
    id: row.id,
    vehicleId: row.vehicleId,
    fileName: row.fileName,
    sizeBytes: row.sizeBytes,
    kind: row.kind,
    ecuRevisionId: row.ecuRevisionId,
    status: row.status,
    progress: row.progress,
    sampleCount: row.sampleCount,
    durationS: row.durationS,
    mapping: columnMappingSchema.parse(row.mapping),
    error: row.error === null ? null : logErrorSchema.parse(row.error),
    channelSummary:
      row.channelSummary === null ? null : logSchema.shape.channelSummary.parse(row.channelSummary),
    parseReport: row.parseReport === null ? null : parseReportSchema.parse(row.parseReport),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** The id of a vehicle's log with this file content (SHA-256), or null. */
export async function findLogIdBySha256(
  db: Executor,
  shopId: string,
  vehicleId: string,
  sha256: string,
): Promise<string | null> {
  const [row] = await db
    .select({ id: logs.id })
    .from(logs)
    .where(and(eq(logs.shopId, shopId), eq(logs.vehicleId, vehicleId), eq(logs.sha256, sha256)))
    .limit(1);
  return row?.id ?? null;
}

/** A log to store at upload, queued for parsing. */
export interface NewLog {
  id: string;
  vehicleId: string;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  kind: LogKind;
  ecuRevisionId: string | null;
  mapping: ColumnMapping;
  parseReport: ParseReport;
  rawPath: string;
  uploadedBy: string;
}

/** Stores a new log of a shop; null when the vehicle already has a log of the same content. */
export async function insertLog(
  db: Executor,
  shopId: string,
  log: NewLog,
): Promise<LogResource | null> {
  const [row] = await db
    .insert(logs)
    .values({
      ...log,
      shopId,
      mapping: asJson(log.mapping),
      parseReport: asJson(log.parseReport),
      status: 'queued',
      progress: 0,
    })
    .onConflictDoNothing({ target: [logs.vehicleId, logs.sha256] })
    .returning();
  return row ? toLog(row) : null;
}

/** One log of a shop, or null when it is not in that shop. */
export async function findLog(
  db: Executor,
  shopId: string,
  logId: string,
): Promise<LogResource | null> {
  const [row] = await db
    .select()
    .from(logs)
    .where(and(eq(logs.shopId, shopId), eq(logs.id, logId)))
    .limit(1);
  return row ? toLog(row) : null;
}

/** Changes a log's kind and/or ECU revision; returns it, or null when it is not in the shop. */
export async function updateLogFacts(
  db: Executor,
  shopId: string,
  logId: string,
  change: { kind?: LogKind; ecuRevisionId?: string | null },
): Promise<LogResource | null> {
  const [row] = await db
    .update(logs)
    .set({ ...change, updatedAt: new Date() })
    .where(and(eq(logs.shopId, shopId), eq(logs.id, logId)))
    .returning();
  return row ? toLog(row) : null;
}

/**
 * Deletes a log of a shop (its channels go with it) and returns where its raw file was, or null
 * when it is not in the shop. Analyses keep their figures: they list log ids, not rows.
 */
export async function deleteLogRow(
  db: Executor,
  shopId: string,
  logId: string,
): Promise<{ rawPath: string } | null> {
  const [row] = await db
    .delete(logs)
    .where(and(eq(logs.shopId, shopId), eq(logs.id, logId)))
    .returning({ rawPath: logs.rawPath });
  return row ?? null;
}

/** The logs of one vehicle of a shop, newest first. */
export async function listLogsOfVehicle(
  db: Executor,
  shopId: string,
  vehicleId: string,
): Promise<LogResource[]> {
  const rows = await db
    .select()
    .from(logs)
    .where(and(eq(logs.shopId, shopId), eq(logs.vehicleId, vehicleId)))
    .orderBy(desc(logs.createdAt), desc(logs.id));
  return rows.map(toLog);
}

/** What the parse job needs about a log. */
export interface LogToParse {
  status: LogStatus;
  rawPath: string;
  mapping: ColumnMapping;
  parseReport: ParseReport;
  stoichAfr: number;
}

/** A log of a shop with its vehicle's stoichiometric AFR, for parsing; null when gone. */
export async function findLogToParse(
  db: Executor,
  shopId: string,
  logId: string,
): Promise<LogToParse | null> {
  const [row] = await db
    .select({
      status: logs.status,
      rawPath: logs.rawPath,
      mapping: logs.mapping,
      parseReport: logs.parseReport,
      stoichAfr: vehicles.stoichAfr,
    })
    .from(logs)
    .innerJoin(vehicles, eq(vehicles.id, logs.vehicleId))
    .where(and(eq(logs.shopId, shopId), eq(logs.id, logId)))
    .limit(1);
  if (!row) return null;
  return {
    status: row.status,
    rawPath: row.rawPath,
    mapping: columnMappingSchema.parse(row.mapping),
    parseReport: parseReportSchema.parse(row.parseReport ?? { mappingSource: 'given' }),
    stoichAfr: row.stoichAfr,
  };
}

/** Changes a log's parse state; returns whether a log in one of `fromStatuses` was changed. */
export async function updateLogState(
  db: Executor,
  shopId: string,
  logId: string,
  fromStatuses: readonly LogStatus[],
  change: {
    status?: LogStatus;
    progress?: number;
    error?: LogError | null;
    sampleCount?: number;
    durationS?: number;
    channelSummary?: object;
    parseReport?: ParseReport;
  },
): Promise<boolean> {
  const { error, channelSummary, parseReport, ...plain } = change;
  const rows = await db
    .update(logs)
    .set({
      ...plain,
      ...(error !== undefined && { error: error === null ? null : asJson(error) }),
      ...(channelSummary !== undefined && { channelSummary: asJson(channelSummary) }),
      ...(parseReport !== undefined && { parseReport: asJson(parseReport) }),
      updatedAt: new Date(),
    })
    .where(
      and(eq(logs.shopId, shopId), eq(logs.id, logId), inArray(logs.status, [...fromStatuses])),
    )
    .returning({ id: logs.id });
  return rows.length > 0;
}

/** One stored channel of a log: its values, encoded. */
export interface StoredChannel {
  channel: string;
  encoding: string;
  sampleCount: number;
  data: Buffer;
}

/** Replaces all stored channels of a log of a shop (use inside a transaction). */
export async function replaceLogChannels(
  db: Executor,
  shopId: string,
  logId: string,
  channels: readonly StoredChannel[],
): Promise<void> {
  const [owned] = await db
    .select({ id: logs.id })
    .from(logs)
    .where(and(eq(logs.shopId, shopId), eq(logs.id, logId)))
    .for('update');
  if (!owned) throw new Error(`replaceLogChannels: log ${logId} is not in shop ${shopId}`);
  await db.delete(logChannels).where(eq(logChannels.logId, logId));
  if (channels.length > 0) {
    await db.insert(logChannels).values(channels.map((c) => ({ ...c, logId })));
  }
}

/** The stored channels of a log of a shop (none when the log is not in that shop). */
export async function readLogChannels(
  db: Executor,
  shopId: string,
  logId: string,
): Promise<StoredChannel[]> {
  return db
    .select({
      channel: logChannels.channel,
      encoding: logChannels.encoding,
      sampleCount: logChannels.sampleCount,
      data: logChannels.data,
    })
    .from(logChannels)
    .innerJoin(logs, eq(logs.id, logChannels.logId))
    .where(and(eq(logs.shopId, shopId), eq(logs.id, logId)));
}

/** A log whose parsing has not finished, in any shop (for resuming after a restart). */
export interface UnfinishedLog {
  id: string;
  shopId: string;
  status: LogStatus;
  rawPath: string;
}

/**
 * Every log still queued or parsing, across shops. Only the server's start-up sweep calls this:
 * it is about the server's own unfinished work, not about any one user's shop.
 */
export async function listUnfinishedLogs(db: Executor): Promise<UnfinishedLog[]> {
  return db
    .select({ id: logs.id, shopId: logs.shopId, status: logs.status, rawPath: logs.rawPath })
    .from(logs)
    .where(inArray(logs.status, ['queued', 'parsing']))
    .orderBy(logs.createdAt);
}
