import { and, asc, desc, eq, max, sql } from 'drizzle-orm';
import { revisions, users, veTables } from '../../db/schema';
import {
  appliedRecordSchema,
  type AppliedRecord,
  type Revision,
  type RevisionStatus,
  type RevisionSummary,
} from '../../shared/contracts/tables';
import type { Executor } from '../db';

/** What a new revision is made of. */
export interface NewRevisionFields {
  /** The table it belongs to (already checked to be in the shop, and locked). */
  tableId: string;
  /** The revision it was derived from; null for a table's first. */
  parentId: string | null;
  /** Its number within the table, 1 upwards. */
  number: number;
  /** VE in percent, `[row][col]`. */
  values: number[][];
  /** What changed and why. */
  message: string;
  /** Who made it. */
  authorId: string;
  /** The analysis it was applied from, if any. */
  analysisId?: string | null;
  /** How it was applied, if it was. */
  applied?: AppliedRecord | null;
}

const summaryColumns = {
  id: revisions.id,
  tableId: revisions.tableId,
  parentId: revisions.parentId,
  number: revisions.number,
  status: revisions.status,
  message: revisions.message,
  authorId: revisions.authorId,
  authorName: users.name,
  analysisId: revisions.analysisId,
  createdAt: revisions.createdAt,
};

interface SummaryRow {
  id: string;
  tableId: string;
  parentId: string | null;
  number: number;
  status: RevisionStatus;
  message: string;
  authorId: string;
  authorName: string;
  analysisId: string | null;
  createdAt: Date;
}

function toSummary(row: SummaryRow): RevisionSummary {
  return { ...row, createdAt: row.createdAt.toISOString() };
}

/** Stores a new revision of a shop's table and returns its id. */
export async function insertRevision(
  db: Executor,
  shopId: string,
  fields: NewRevisionFields,
): Promise<string> {
  const [row] = await db
    .insert(revisions)
    .values({ shopId, ...fields })
    .returning({ id: revisions.id });
  if (!row) throw new Error('insertRevision: no row returned');
  return row.id;
}

/** One revision of a shop with its values, or null when there is none with this id there. */
export async function findRevision(
  db: Executor,
  shopId: string,
  id: string,
): Promise<Revision | null> {
  const [row] = await db
    .select({ ...summaryColumns, values: revisions.values, applied: revisions.applied })
    .from(revisions)
    .innerJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.shopId, shopId), eq(revisions.id, id)))
    .limit(1);
  if (!row) return null;
  // Parsed once here, so a stored record that drifted from the contract fails loudly.
  const applied = row.applied === null ? null : appliedRecordSchema.parse(row.applied);
  return { ...toSummary(row), values: row.values, applied };
}

/** The revisions of a shop's table without their values, by number ascending. */
export async function listRevisionsOfTable(
  db: Executor,
  shopId: string,
  tableId: string,
): Promise<RevisionSummary[]> {
  const rows = await db
    .select(summaryColumns)
    .from(revisions)
    .innerJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.shopId, shopId), eq(revisions.tableId, tableId)))
    .orderBy(asc(revisions.number));
  return rows.map(toSummary);
}

/** The highest revision number of a shop's table, 0 when it has none. */
export async function findLastRevisionNumber(
  db: Executor,
  shopId: string,
  tableId: string,
): Promise<number> {
  const [row] = await db
    .select({ last: max(revisions.number) })
    .from(revisions)
    .where(and(eq(revisions.shopId, shopId), eq(revisions.tableId, tableId)));
  return row?.last ?? 0;
}

/** The vehicle whose table a revision of a shop belongs to, or null when it is not in that shop. */
export async function findRevisionVehicleId(
  db: Executor,
  shopId: string,
  revisionId: string,
): Promise<string | null> {
  const [row] = await db
    .select({ vehicleId: veTables.vehicleId })
    .from(revisions)
    .innerJoin(veTables, eq(veTables.id, revisions.tableId))
    .where(and(eq(revisions.shopId, shopId), eq(revisions.id, revisionId)))
    .limit(1);
  return row?.vehicleId ?? null;
}

/** A revision's values on its table's axes: the VE table an ECU ran. */
export interface RevisionTable {
  /** The revision. */
  revisionId: string;
  /** The vehicle whose table it is. */
  vehicleId: string;
  /** RPM breakpoints. */
  rpmAxis: number[];
  /** MAP breakpoints, kPa. */
  mapAxisKpa: number[];
  /** VE in percent, rows following `mapAxisKpa`. */
  values: number[][];
}

const revisionTableColumns = {
  revisionId: revisions.id,
  vehicleId: veTables.vehicleId,
  rpmAxis: veTables.rpmAxis,
  mapAxisKpa: veTables.mapAxisKpa,
  values: revisions.values,
};

/** A revision of a shop with its table's axes, or null when it is not in that shop. */
export async function findRevisionTable(
  db: Executor,
  shopId: string,
  revisionId: string,
): Promise<RevisionTable | null> {
  const [row] = await db
    .select(revisionTableColumns)
    .from(revisions)
    .innerJoin(veTables, eq(veTables.id, revisions.tableId))
    .where(and(eq(revisions.shopId, shopId), eq(revisions.id, revisionId)))
    .limit(1);
  return row ?? null;
}

/**
 * The head revision of a vehicle's first table (oldest first, as the vehicle page lists them),
 * or null when the vehicle has no table with a revision. A table whose head is not recorded
 * gives its highest-numbered revision.
 */
export async function findFirstTableHead(
  db: Executor,
  shopId: string,
  vehicleId: string,
): Promise<RevisionTable | null> {
  const [row] = await db
    .select(revisionTableColumns)
    .from(veTables)
    .innerJoin(revisions, eq(revisions.tableId, veTables.id))
    .where(and(eq(veTables.shopId, shopId), eq(veTables.vehicleId, vehicleId)))
    .orderBy(
      asc(veTables.createdAt),
      asc(veTables.id),
      desc(sql`${revisions.id} = ${veTables.headRevisionId}`),
      desc(revisions.number),
    )
    .limit(1);
  return row ?? null;
}
