import { and, eq } from 'drizzle-orm';
import { analyses, type AnalysisRow, type NewAnalysisRow } from '../../db/schema';
import type { Executor } from '../db';

/** Stores an analysis and returns its row. */
export async function insertAnalysis(db: Executor, values: NewAnalysisRow): Promise<AnalysisRow> {
  const [row] = await db.insert(analyses).values(values).returning();
  if (!row) throw new Error('insertAnalysis: no row returned');
  return row;
}

/** One analysis of a shop, or null. */
export async function findAnalysis(
  db: Executor,
  shopId: string,
  id: string,
): Promise<AnalysisRow | null> {
  const rows = await db
    .select()
    .from(analyses)
    .where(and(eq(analyses.shopId, shopId), eq(analyses.id, id)))
    .limit(1);
  return rows[0] ?? null;
}
