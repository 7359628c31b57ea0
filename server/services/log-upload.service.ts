import { randomUUID } from 'node:crypto';
import {
  columnMappingSchema,
  type LogResource,
  type MappingSource,
  type UploadLogFields,
  type UploadLogResponse,
} from '../../shared/contracts/logs';
import {
  createLogBuilder,
  headerSignature,
  isImportError,
  planImport,
  sniffCsv,
  SNIFF_LENGTH,
  type ColumnMapping,
  type ImportError,
} from '../../shared/import';
import type { AppContext } from '../context';
import type { Database } from '../db';
import { AppError, conflict, notFound } from '../errors/app-error';
import { findLogIdBySha256, insertLog } from '../repositories/logs.repository';
import { findRevisionVehicleId } from '../repositories/revisions.repository';
import { findPresetBySignature, savePreset } from '../repositories/mapping-presets.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import {
  keepReceivedFile,
  rawPathFor,
  removeFileIfPresent,
  removeRawFile,
  type ReceivedFile,
} from './log-storage.service';

import { requireVehicle } from './logs.service';

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
