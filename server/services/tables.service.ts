import type {
  CreateTableRequest,
  RevisionSummary,
  VeTableResource,
} from '../../shared/contracts/tables';
import type { Database } from '../db';
import { notFound } from '../errors/app-error';
import { recordAudit } from '../repositories/audit.repository';
import { insertRevision, listRevisionsOfTable } from '../repositories/revisions.repository';
import {
  findTable,
  insertTable,
  listTablesOfVehicle,
  setHeadRevision,
} from '../repositories/tables.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { findVehicle } from '../repositories/vehicles.repository';

/** The message of every table's first revision. */
export const INITIAL_REVISION_MESSAGE = 'Initial table';

/**
 * Creates a table on a vehicle of the actor's shop together with its first revision (number 1,
 * a draft), in one transaction: a table never exists without values. 404 for another shop's
 * vehicle.
 */
export function createTable(
  db: Database,
  actor: SessionUserRecord,
  vehicleId: string,
  body: CreateTableRequest,
): Promise<VeTableResource> {
  return db.transaction(async (tx) => {
    const vehicle = await findVehicle(tx, actor.shopId, vehicleId);
    if (!vehicle) throw notFound('Vehicle');
    const table = await insertTable(tx, actor.shopId, {
      vehicleId,
      name: body.name,
      rpmAxis: body.rpmAxis,
      mapAxisKpa: body.mapAxisKpa,
    });
    const revisionId = await insertRevision(tx, actor.shopId, {
      tableId: table.id,
      parentId: null,
      number: 1,
      values: body.values,
      message: INITIAL_REVISION_MESSAGE,
      authorId: actor.id,
    });
    await setHeadRevision(tx, actor.shopId, table.id, revisionId);
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'table.created',
      targetType: 'table',
      targetId: table.id,
      details: { vehicleId, name: table.name, revisionId },
    });
    return { ...table, headRevisionId: revisionId };
  });
}

/** The tables of a vehicle of the actor's shop; 404 when the vehicle is not there. */
export async function listVehicleTables(
  db: Database,
  actor: SessionUserRecord,
  vehicleId: string,
): Promise<VeTableResource[]> {
  const vehicle = await findVehicle(db, actor.shopId, vehicleId);
  if (!vehicle) throw notFound('Vehicle');
  return listTablesOfVehicle(db, actor.shopId, vehicleId);
}

/** One table of the actor's shop; 404 when it is not there. */
export async function getTable(
  db: Database,
  actor: SessionUserRecord,
  id: string,
): Promise<VeTableResource> {
  const table = await findTable(db, actor.shopId, id);
  if (!table) throw notFound('Table');
  return table;
}

/** The revisions of a table of the actor's shop without their values, by number. */
export async function listTableRevisions(
  db: Database,
  actor: SessionUserRecord,
  tableId: string,
): Promise<RevisionSummary[]> {
  const table = await findTable(db, actor.shopId, tableId);
  if (!table) throw notFound('Table');
  return listRevisionsOfTable(db, actor.shopId, tableId);
}
