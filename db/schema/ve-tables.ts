import {
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { shops } from './shops';
import { users } from './users';
import { vehicles } from './vehicles';

/** A VE table of a vehicle: its axes; its values live in revisions. */
export const veTables = pgTable(
  've_tables',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    rpmAxis: doublePrecision('rpm_axis').array().notNull(),
    mapAxisKpa: doublePrecision('map_axis_kpa').array().notNull(),
    /** The newest revision (no foreign key: revisions point back at the table). */
    headRevisionId: uuid('head_revision_id'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('ve_tables_shop_idx').on(table.shopId),
    index('ve_tables_vehicle_idx').on(table.vehicleId),
  ],
);

/** A table row. */
export type VeTableRow = typeof veTables.$inferSelect;
/** A table to insert. */
export type NewVeTableRow = typeof veTables.$inferInsert;

/** Where a revision is in review. */
export const revisionStatusEnum = pgEnum('revision_status', [
  'draft',
  'in_review',
  'approved',
  'sent_back',
]);

/** One immutable set of a table's values, with its parent, author and message. */
export const revisions = pgTable(
  'revisions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    tableId: uuid('table_id')
      .notNull()
      .references(() => veTables.id, { onDelete: 'cascade' }),
    parentId: uuid('parent_id'),
    number: integer('number').notNull(),
    /** VE in percent, `[row][col]`, rows following the table's MAP axis. */
    values: jsonb('values').$type<number[][]>().notNull(),
    message: text('message').notNull().default(''),
    status: revisionStatusEnum('status').notNull().default('draft'),
    authorId: uuid('author_id')
      .notNull()
      .references(() => users.id),
    /** The analysis this revision was applied from, if any. */
    analysisId: uuid('analysis_id'),
    /**
     * How an applied revision was made (step, smoothing, fill, the fuel-safety guard or its
     * explicit absence, the cells held for data); null for a revision saved from the grid.
     */
    applied: jsonb('applied').$type<Record<string, unknown>>(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('revisions_table_number_key').on(table.tableId, table.number),
    index('revisions_shop_idx').on(table.shopId),
  ],
);

/** A revision row. */
export type RevisionRow = typeof revisions.$inferSelect;
/** A revision to insert. */
export type NewRevisionRow = typeof revisions.$inferInsert;
