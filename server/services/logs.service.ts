import { randomUUID } from 'node:crypto';
import type { ColumnarLog, Channel } from '../../shared/core/channels';
import {
  columnMappingSchema,
  type BeyondTable,
  type LogResource,
  type MappingPreset as MappingPresetResource,
  type MappingSource,
  type UploadLogFields,
  type UploadLogResponse,
} from '../../shared/contracts/logs';
import type { VeTableResource } from '../../shared/contracts/tables';
import {
  createLogBuilder,
  headerSignature,
  isChannel,
  isImportError,
  planImport,
  shareAbove,
  sniffCsv,
  SNIFF_LENGTH,
  type ColumnMapping,
  type ImportError,
} from '../../shared/import';
import type { AppContext } from '../context';
import type { Database } from '../db';
import { AppError, conflict, notFound } from '../errors/app-error';
import {
  findLog,
  findLogIdBySha256,
  findRevisionVehicleId,
  findVehicleFacts,
  insertLog,
  listLogsOfVehicle,
  readLogChannels,
  type VehicleFacts,
} from '../repositories/logs.repository';
import {
  findPresetBySignature,
  listPresets,
  savePreset,
  type MappingPreset,
} from '../repositories/mapping-presets.repository';
import { listTablesOfVehicle } from '../repositories/tables.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { decodeChannel } from './channel-codec';
import {
  keepReceivedFile,
  rawPathFor,
  removeFileIfPresent,
  removeRawFile,
  type ReceivedFile,
} from './log-storage.service';

/** Import errors that say the file cannot be used (422); the others are bad input (400). */
const UNUSABLE_FILE_CODES: ReadonlySet<string> = new Set([
  'missing_channels',
  'unknown_column',
  'no_usable_rows',
]);

/** The API's answer to an import error: 400 or 422, with the row/column/missing facts. */
function importErrorAnswer(err: ImportError): AppError {
  const isUnusable = UNUSABLE_FILE_CODES.has(err.code);
  const path = err.code === 'invalid_mapping' ? `body.mapping.${err.details.field ?? ''}` : 'file';
  return new AppError(
    isUnusable ? 422 : 400,
    isUnusable ? 'unusable_file' : 'invalid_input',
    `The file cannot be imported: ${err.message}`,
    { reason: err.code, ...err.details, issues: [{ path, message: err.message }] },
  );
}

/** A 400 naming the part of the request at fault, shaped like the `validate` middleware's. */
function badInput(path: string, message: string, extra: object = {}): AppError {
  return new AppError(400, 'invalid_input', `Invalid ${path}: ${message}`, {
    ...extra,
    issues: [{ path, message }],
  });
}

/** A vehicle of the user's shop with what parsing needs; 404 when it is not in their shop. */
export async function requireVehicle(
  db: Database,
  user: SessionUserRecord,
  vehicleId: string,
): Promise<VehicleFacts> {
  const vehicle = await findVehicleFacts(db, user.shopId, vehicleId);
  if (!vehicle) throw notFound('Vehicle');
  return vehicle;
}

/** The head of a received file as text, as the importer will see it. */
function headTextOf(file: ReceivedFile): { text: string; isTruncated: boolean } {
  // `stream: true` holds back a character cut at the end of the head instead of garbling it;
  // TextDecoder also drops a byte-order mark, as the importer does.
  const text = new TextDecoder('utf-8').decode(file.head, { stream: true });
  const isTruncated = file.sizeBytes > file.head.length || text.length > SNIFF_LENGTH;
  return { text: text.slice(0, SNIFF_LENGTH), isTruncated };
}

/** How an upload will be read, and where its mapping came from. */
interface UploadPlan {
  readonly mapping: ColumnMapping;
  readonly source: MappingSource;
  readonly signature: string;
}

/**
 * Settles the mapping of an upload from the head of its file: the caller's, else the shop's
 * preset for this header, else the suggestion. A preset that no longer fits (say, the rows moved)
 * gives way to the suggestion rather than refusing the file. Throws an ImportError when the file
 * cannot be used — the same checks the parse job would make, so a bad file is refused at once.
 */
async function planUpload(
  db: Database,
  shopId: string,
  file: ReceivedFile,
  given: ColumnMapping | undefined,
  stoichAfr: number,
): Promise<UploadPlan> {
  const { text, isTruncated } = headTextOf(file);
  const signature = headerSignature(sniffCsv(text, { isTruncated }).columns);
  const check = (mapping: ColumnMapping | undefined): ColumnMapping => {
    const planned = planImport(text, mapping, { isTruncated }).mapping;
    // The builder refuses a mapping without the required channels (the plan only checks columns).
    createLogBuilder(planned, { stoichAfr });
    return planned;
  };
  if (given) return { mapping: check(given), source: 'given', signature };
  const preset = await findPresetBySignature(db, shopId, signature);
  const saved = preset ? columnMappingSchema.safeParse(preset.mapping) : null;
  if (saved?.success) {
    try {
      return { mapping: check(saved.data), source: 'preset', signature };
    } catch (err) {
      if (!isImportError(err)) throw err;
    }
  }
  return { mapping: check(undefined), source: 'suggested', signature };
}

/**
 * Keeps an uploaded log: checks the file's head (mapping given, from a preset or suggested),
 * refuses a file the vehicle already has (409 with its `logId`), stores the compressed file and
 * the log row (queued), saves a given mapping as the shop's preset for that header, and queues
 * the parse. The row and preset are written together; the file is removed if they are not, and
 * the temporary file is gone before the answer leaves, whatever the answer.
 */
export async function uploadLog(
  ctx: AppContext,
  user: SessionUserRecord,
  vehicleId: string,
  fields: UploadLogFields,
  file: ReceivedFile | null,
): Promise<UploadLogResponse> {
  try {
    return await keepUpload(ctx, user, vehicleId, fields, file);
  } finally {
    if (file) await removeFileIfPresent(file.tmpPath);
  }
}

async function keepUpload(
  ctx: AppContext,
  user: SessionUserRecord,
  vehicleId: string,
  fields: UploadLogFields,
  file: ReceivedFile | null,
): Promise<UploadLogResponse> {
  const { db, config } = ctx;
  const shopId = user.shopId;
  const vehicle = await requireVehicle(db, user, vehicleId);
  if (!file) throw badInput('file', 'attach the log as the multipart part "file"');
  if (fields.ecuRevisionId) {
    const revisionVehicleId = await findRevisionVehicleId(db, shopId, fields.ecuRevisionId);
    if (!revisionVehicleId) throw notFound('Revision');
    if (revisionVehicleId !== vehicleId) {
      throw badInput('body.ecuRevisionId', "is a revision of another vehicle's table");
    }
  }
  if (file.sizeBytes === 0) throw badInput('file', 'the file is empty', { reason: 'no_data' });
  const duplicateOf = await findLogIdBySha256(db, shopId, vehicleId, file.sha256);
  if (duplicateOf) throw duplicateAnswer(duplicateOf);

  let plan: UploadPlan;
  try {
    plan = await planUpload(db, shopId, file, fields.mapping, vehicle.stoichAfr);
  } catch (err) {
    throw isImportError(err) ? importErrorAnswer(err) : err;
  }

  const id = randomUUID();
  const rawPath = rawPathFor(shopId, id);
  await keepReceivedFile(config.dataDir, file, rawPath);
  let stored: LogResource | null;
  try {
    stored = await db.transaction(async (tx) => {
      const log = await insertLog(tx, shopId, {
        id,
        vehicleId,
        fileName: file.fileName,
        sizeBytes: file.sizeBytes,
        sha256: file.sha256,
        kind: fields.kind,
        ecuRevisionId: fields.ecuRevisionId ?? null,
        mapping: plan.mapping,
        parseReport: { mappingSource: plan.source },
        rawPath,
        uploadedBy: user.id,
      });
      // The caller's own mapping (not the completed one) is saved, so that the layout of the
      // next file with this header is still detected rather than pinned.
      if (log && fields.mapping) {
        await savePreset(tx, shopId, {
          name: `Columns of ${file.fileName}`.slice(0, 200),
          headerSignature: plan.signature,
          mapping: fields.mapping,
          createdBy: user.id,
        });
      }
      return log;
    });
  } catch (err) {
    await removeRawFile(config.dataDir, rawPath);
    throw err;
  }
  if (!stored) {
    // The same file arrived twice at once and the other upload won.
    await removeRawFile(config.dataDir, rawPath);
    throw duplicateAnswer(await findLogIdBySha256(db, shopId, vehicleId, file.sha256));
  }
  try {
    await ctx.logJobs.enqueueParse({ shopId, logId: id });
  } catch (err) {
    // The log is stored and queued: the start-up sweep queues its parse again.
    console.error(`[cellsmith] log ${id} is stored but its parse could not be queued:`, err);
  }
  return { id, status: stored.status, mapping: plan.mapping, mappingSource: plan.source };
}

function duplicateAnswer(logId: string | null): AppError {
  return conflict('This file is already a log of this vehicle', { logId });
}

/** One log of the user's shop; 404 when it is not in their shop. */
export async function getLog(
  db: Database,
  user: SessionUserRecord,
  logId: string,
): Promise<LogResource> {
  const log = await findLog(db, user.shopId, logId);
  if (!log) throw notFound('Log');
  const tables = await listTablesOfVehicle(db, user.shopId, log.vehicleId);
  return { ...log, beyondTables: beyondTables(log, tables) };
}

/** The tables a parsed log runs past the top of, with the share of its samples beyond. */
function beyondTables(log: LogResource, tables: readonly VeTableResource[]): BeyondTable[] {
  const rpm = log.channelSummary?.rpm;
  const map = log.channelSummary?.map;
  if (!rpm || !map || rpm.max === null || map.max === null) return [];
  const out: BeyondTable[] = [];
  for (const table of tables) {
    const rpmTop = table.rpmAxis[table.rpmAxis.length - 1] as number;
    const mapTopKpa = table.mapAxisKpa[table.mapAxisKpa.length - 1] as number;
    if (!(rpm.max > rpmTop) && !(map.max > mapTopKpa)) continue;
    out.push({
      tableId: table.id,
      tableName: table.name,
      rpmTop,
      logRpmMax: rpm.max,
      mapTopKpa,
      logMapMaxKpa: map.max,
      shareAboveRpm: rpm.permille ? shareAbove(rpm.permille, rpmTop) : null,
      shareAboveMap: map.permille ? shareAbove(map.permille, mapTopKpa) : null,
    });
  }
  return out;
}

/** The logs of a vehicle of the user's shop, newest first; 404 when the vehicle is not theirs. */
export async function listVehicleLogs(
  db: Database,
  user: SessionUserRecord,
  vehicleId: string,
): Promise<LogResource[]> {
  await requireVehicle(db, user, vehicleId);
  return listLogsOfVehicle(db, user.shopId, vehicleId);
}

/**
 * A parsed log's samples as a ColumnarLog (canonical units), for the analysis. 404 when the
 * log is not in the shop, 409 (with `status`) when it is not parsed yet or failed.
 */
export async function loadLogChannels(
  db: Database,
  shopId: string,
  logId: string,
): Promise<ColumnarLog> {
  const log = await findLog(db, shopId, logId);
  if (!log) throw notFound('Log');
  if (log.status !== 'ready' || log.sampleCount === null) {
    throw conflict(`Log ${logId} is ${log.status}, not ready`, { logId, status: log.status });
  }
  const channels: Partial<Record<Channel, Float64Array>> = {};
  for (const row of await readLogChannels(db, shopId, logId)) {
    if (!isChannel(row.channel)) continue;
    channels[row.channel] = await decodeChannel(row.data, row.encoding, row.sampleCount);
  }
  return { length: log.sampleCount, channels };
}

/** A stored preset as the API answers it; null when its mapping no longer passes the schema. */
function presetResource(preset: MappingPreset): MappingPresetResource | null {
  const mapping = columnMappingSchema.safeParse(preset.mapping);
  if (!mapping.success) return null;
  return {
    signature: preset.headerSignature,
    name: preset.name,
    mapping: mapping.data,
    updatedAt: preset.updatedAt.toISOString(),
  };
}

/**
 * The shop's saved mapping for a header signature (as `headerSignature` of shared/import makes
 * it); 404 when the shop has none, or only one the upload would not use any more either.
 */
export async function getMappingPreset(
  db: Database,
  user: SessionUserRecord,
  signature: string,
): Promise<MappingPresetResource> {
  const preset = await findPresetBySignature(db, user.shopId, signature);
  const resource = preset && presetResource(preset);
  if (!resource) throw notFound('Mapping preset');
  return resource;
}

/**
 * The shop's saved mappings, by header signature; with `signature`, only that header's (none
 * or one), so a client can ask whether a preset exists without an error answer.
 */
export async function listMappingPresets(
  db: Database,
  user: SessionUserRecord,
  signature?: string,
): Promise<MappingPresetResource[]> {
  const presets =
    signature === undefined
      ? await listPresets(db, user.shopId)
      : [await findPresetBySignature(db, user.shopId, signature)].filter((p) => p !== null);
  return presets.flatMap((preset) => presetResource(preset) ?? []);
}
