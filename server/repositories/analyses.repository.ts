import { and, count, desc, eq, sql } from 'drizzle-orm';
import { analyses, revisions, users, type AnalysisRow } from '../../db/schema';
import {
  analysisSettingsSchema,
  type AnalysisSummary,
  type ListAnalysesQuery,
} from '../../shared/contracts/analyses';
import type { Executor } from '../db';
import { storedAnalysisJsonSchema, type StoredAnalysis } from './stored-analysis';

/** A row with its JSON parsed by the stored schemas. */
function toStored(row: AnalysisRow): StoredAnalysis {
  const json = storedAnalysisJsonSchema.parse(row);
  return {
    id: row.id,
    shopId: row.shopId,
    tableId: row.tableId,
    baseRevisionId: row.baseRevisionId,
    logIds: row.logIds,
    createdBy: row.createdBy,
    createdAt: row.createdAt,
    ...json,
  };
}

/** Stores an analysis and returns it as read back. */
export async function insertAnalysis(
  db: Executor,
  values: Omit<StoredAnalysis, 'id' | 'createdAt'>,
): Promise<StoredAnalysis> {
  const [row] = await db.insert(analyses).values(values).returning();
  if (!row) throw new Error('insertAnalysis: no row returned');
  return toStored(row);
}

/** One analysis of a shop, or null. */
export async function findAnalysis(
  db: Executor,
  shopId: string,
  id: string,
): Promise<StoredAnalysis | null> {
  const rows = await db
    .select()
    .from(analyses)
    .where(and(eq(analyses.shopId, shopId), eq(analyses.id, id)))
    .limit(1);
  return rows[0] ? toStored(rows[0]) : null;
}

/**
 * A page of a table's analyses, newest first, and how many it has. Only the small columns are
 * read: the per-cell grids and the proposal (tens of kB each) stay in the database, and the
 * trusted-cell and lean-flag counts are taken from the stored report inside PostgreSQL.
 */
export async function listAnalysesOfTable(
  db: Executor,
  shopId: string,
  tableId: string,
  query: ListAnalysesQuery,
): Promise<{ items: AnalysisSummary[]; total: number }> {
  const where = and(eq(analyses.shopId, shopId), eq(analyses.tableId, tableId));
  const rows = await db
    .select({
      id: analyses.id,
      tableId: analyses.tableId,
      baseRevisionId: analyses.baseRevisionId,
      baseRevisionNumber: revisions.number,
      logIds: analyses.logIds,
      settings: analyses.settings,
      createdAt: analyses.createdAt,
      trustedCells: sql<number>`coalesce((${analyses.filterReport}->>'cellsTrusted')::int, 0)`,
      // Only the loud flags: a 'watch' rests on too little data to act on.
      leanFlagCount: sql<number>`(SELECT count(*) FROM jsonb_array_elements(${analyses.leanFlags}) AS f WHERE f->>'severity' IS DISTINCT FROM 'watch')`,
      authorName: users.name,
    })
    .from(analyses)
    .innerJoin(revisions, eq(revisions.id, analyses.baseRevisionId))
    .leftJoin(users, eq(users.id, analyses.createdBy))
    .where(where)
    // The id breaks ties of the same instant so pages never overlap.
    .orderBy(desc(analyses.createdAt), desc(analyses.id))
    .limit(query.limit)
    .offset(query.offset);
  const [counted] = await db.select({ total: count() }).from(analyses).where(where);
  return {
    items: rows.map((row) => ({
      ...row,
      settings: analysisSettingsSchema.parse(row.settings),
      trustedCells: Number(row.trustedCells),
      leanFlagCount: Number(row.leanFlagCount),
      createdAt: row.createdAt.toISOString(),
    })),
    total: counted?.total ?? 0,
  };
}
