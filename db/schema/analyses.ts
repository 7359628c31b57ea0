import { index, jsonb, pgTable, timestamp, uuid } from 'drizzle-orm/pg-core';
import { shops } from './shops';
import { users } from './users';
import { revisions, veTables } from './ve-tables';

/**
 * One run of the pipeline over some logs against a base revision: its settings and everything it
 * found (per-cell results, the proposal, the filter funnel, the delay), kept so a reviewer can
 * see why each cell of an applied revision moved.
 */
export const analyses = pgTable(
  'analyses',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    tableId: uuid('table_id')
      .notNull()
      .references(() => veTables.id, { onDelete: 'cascade' }),
    baseRevisionId: uuid('base_revision_id')
      .notNull()
      .references(() => revisions.id, { onDelete: 'cascade' }),
    logIds: uuid('log_ids').array().notNull(),
    settings: jsonb('settings').$type<object>().notNull(),
    /** Per-cell results, grids as `[row][col]` arrays (null for "no value"). */
    cells: jsonb('cells').$type<object>().notNull(),
    /** The proposal: values, ratio, change %, status per cell. */
    proposal: jsonb('proposal').$type<object>().notNull(),
    /** Per log: samples, kept, the funnel and the delay used. */
    filterReport: jsonb('filter_report').$type<object>().notNull(),
    /** Cells measured leaner than commanded under load. */
    leanFlags: jsonb('lean_flags').$type<unknown[]>().notNull(),
    createdBy: uuid('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('analyses_shop_idx').on(table.shopId),
    index('analyses_table_idx').on(table.tableId),
  ],
);

/** An analysis row. */
export type AnalysisRow = typeof analyses.$inferSelect;
/** An analysis to insert. */
export type NewAnalysisRow = typeof analyses.$inferInsert;
