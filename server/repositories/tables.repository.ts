import { and, asc, eq } from 'drizzle-orm';
import { veTables, type VeTableRow } from '../../db/schema';
import type { VeTableResource } from '../../shared/contracts/tables';
import type { Executor } from '../db';

/** What a new table is made of. */
export interface NewTableFields {
  /** The vehicle it belongs to (already checked to be in the shop). */
  vehicleId: string;
  /** Its name. */
  name: string;
  /** RPM breakpoints (columns), ascending. */
  rpmAxis: number[];
  /** MAP breakpoints in kPa (rows), ascending. */
  mapAxisKpa: number[];
}

function toTable(row: VeTableRow): VeTableResource {
  return {
    id: row.id,
    vehicleId: row.vehicleId,
    name: row.name,
    rpmAxis: row.rpmAxis,
    mapAxisKpa: row.mapAxisKpa,
    headRevisionId: row.headRevisionId,
    createdAt: row.createdAt.toISOString(),
  };
}

/** Stores a new table of a shop, still without a head revision. */
export async function insertTable(
  db: Executor,
  shopId: string,
  fields: NewTableFields,
): Promise<VeTableResource> {
  const [row] = await db
    .insert(veTables)
    .values({ shopId, ...fields })
    .returning();
  if (!row) throw new Error('insertTable: no row returned');
  return toTable(row);
}

/**
 * One table of a shop, or null when there is none with this id in that shop. With `forUpdate`
 * (inside a transaction) the row stays locked until the transaction ends: new revisions of one
 * table are then numbered one after another.
 */
export async function findTable(
  db: Executor,
  shopId: string,
  id: string,
  options: { forUpdate?: boolean } = {},
): Promise<VeTableResource | null> {
  const query = db
    .select()
    .from(veTables)
    .where(and(eq(veTables.shopId, shopId), eq(veTables.id, id)))
    .limit(1);
  const [row] = options.forUpdate ? await query.for('update') : await query;
  return row ? toTable(row) : null;
}

/** The tables of a shop's vehicle, oldest first. */
export async function listTablesOfVehicle(
  db: Executor,
  shopId: string,
  vehicleId: string,
): Promise<VeTableResource[]> {
  const rows = await db
    .select()
    .from(veTables)
    .where(and(eq(veTables.shopId, shopId), eq(veTables.vehicleId, vehicleId)))
    .orderBy(asc(veTables.createdAt), asc(veTables.id));
  return rows.map(toTable);
}

/** Points a shop's table at its newest revision. */
export async function setHeadRevision(
  db: Executor,
  shopId: string,
  tableId: string,
  revisionId: string,
): Promise<void> {
  await db
    .update(veTables)
    .set({ headRevisionId: revisionId })
    .where(and(eq(veTables.shopId, shopId), eq(veTables.id, tableId)));
}
