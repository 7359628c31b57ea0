import type { LogResource, UpdateLogRequest } from '../../shared/contracts/logs';
import type { AppContext } from '../context';
import { conflict, notFound } from '../errors/app-error';
import { invalidInput } from '../errors/invalid-input';
import { recordAudit } from '../repositories/audit.repository';
import { deleteLogRow, findLog, updateLogFacts } from '../repositories/logs.repository';
import { findRevisionVehicleId } from '../repositories/revisions.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { removeRawFile } from './log-storage.service';
import { getLog } from './logs.service';

/**
 * Puts a log's facts right after its upload: its kind, and the revision its ECU ran (which must be
 * a revision of a table of the log's own vehicle; null says "not known"). 404 when the log or the
 * revision is not in the shop; 400 naming `body.ecuRevisionId` for another vehicle's revision.
 */
export async function changeLog(
  ctx: AppContext,
  actor: SessionUserRecord,
  logId: string,
  change: UpdateLogRequest,
): Promise<LogResource> {
  const log = await findLog(ctx.db, actor.shopId, logId);
  if (!log) throw notFound('Log');
  if (change.ecuRevisionId) {
    const vehicleId = await findRevisionVehicleId(ctx.db, actor.shopId, change.ecuRevisionId);
    if (vehicleId === null) throw notFound('Revision');
    if (vehicleId !== log.vehicleId) {
      throw invalidInput(
        'body.ecuRevisionId',
        'the revision belongs to a table of another vehicle',
      );
    }
  }
  await ctx.db.transaction(async (tx) => {
    await updateLogFacts(tx, actor.shopId, logId, change);
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'log.changed',
      targetType: 'log',
      targetId: logId,
      details: { before: { kind: log.kind, ecuRevisionId: log.ecuRevisionId }, change },
    });
  });
  return getLog(ctx.db, actor, logId);
}

/**
 * Deletes a log: its row and channels in one transaction, then its stored file. Analyses that used
 * it keep their figures (reading their samples again then answers 409 naming the gone log). A log
 * still queued or being read is refused with 409: its parse job would write into a gone row.
 */
export async function deleteLog(
  ctx: AppContext,
  actor: SessionUserRecord,
  logId: string,
): Promise<void> {
  const log = await findLog(ctx.db, actor.shopId, logId);
  if (!log) throw notFound('Log');
  if (log.status === 'queued' || log.status === 'parsing') {
    throw conflict(`Log ${logId} is still being read; delete it once it is ready or failed`, {
      logId,
      status: log.status,
    });
  }
  const removed = await ctx.db.transaction(async (tx) => {
    const row = await deleteLogRow(tx, actor.shopId, logId);
    if (!row) throw notFound('Log');
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'log.deleted',
      targetType: 'log',
      targetId: logId,
      details: { vehicleId: log.vehicleId, fileName: log.fileName },
    });
    return row;
  });
  // After the commit: a file left by a crash here is only disk space, never a dangling row.
  await removeRawFile(ctx.config.dataDir, removed.rawPath);
}
