import {
  bigint,
  customType,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { shops } from './shops';
import { users } from './users';
import { revisions } from './ve-tables';
import { vehicles } from './vehicles';

/** PostgreSQL bytea as a Node Buffer. */
export const bytea = customType<{ data: Buffer; driverData: Buffer }>({
  dataType: () => 'bytea',
});

/** Road drive or dyno session. */
export const logKindEnum = pgEnum('log_kind', ['road', 'dyno']);

/** Where a log is in its parsing. */
export const logStatusEnum = pgEnum('log_status', ['queued', 'parsing', 'ready', 'failed']);

/** An uploaded log: the file's facts, how it was mapped, and what parsing found. */
export const logs = pgTable(
  'logs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    fileName: text('file_name').notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
    sha256: text('sha256').notNull(),
    kind: logKindEnum('kind').notNull(),
    /** The revision the ECU ran while the log was recorded. */
    ecuRevisionId: uuid('ecu_revision_id').references(() => revisions.id, { onDelete: 'set null' }),
    /** The column mapping used (the API's mapping shape). */
    mapping: jsonb('mapping').$type<Record<string, unknown>>().notNull(),
    status: logStatusEnum('status').notNull().default('queued'),
    /** 0–1 while parsing. */
    progress: doublePrecision('progress').notNull().default(0),
    /** Why parsing failed: `{ code, message, details? }`. */
    error: jsonb('error').$type<Record<string, unknown>>(),
    sampleCount: integer('sample_count'),
    durationS: doublePrecision('duration_s'),
    /** Per channel: min, max, mean, NaN count. */
    channelSummary: jsonb('channel_summary').$type<Record<string, unknown>>(),
    /** Rows read, kept and dropped, and the first problems with their row and column. */
    parseReport: jsonb('parse_report').$type<Record<string, unknown>>(),
    /** Where the compressed raw file is kept, relative to the data folder. */
    rawPath: text('raw_path').notNull(),
    uploadedBy: uuid('uploaded_by')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('logs_vehicle_sha256_key').on(table.vehicleId, table.sha256),
    index('logs_shop_idx').on(table.shopId),
  ],
);

/** A log row. */
export type LogRow = typeof logs.$inferSelect;
/** A log to insert. */
export type NewLogRow = typeof logs.$inferInsert;

/**
 * A log's parsed samples, one row per channel: the Float64 values, little-endian, compressed.
 * Written in the same transaction that marks the log ready, so a log never has half its channels.
 */
export const logChannels = pgTable(
  'log_channels',
  {
    logId: uuid('log_id')
      .notNull()
      .references(() => logs.id, { onDelete: 'cascade' }),
    channel: text('channel').notNull(),
    /** How `data` is encoded, e.g. `f64le+deflate`. */
    encoding: text('encoding').notNull(),
    sampleCount: integer('sample_count').notNull(),
    data: bytea('data').notNull(),
  },
  (table) => [primaryKey({ columns: [table.logId, table.channel] })],
);

/** A log channel row. */
export type LogChannelRow = typeof logChannels.$inferSelect;

/** A shop's saved column mappings, recognised again by the header they were made for. */
export const mappingPresets = pgTable(
  'mapping_presets',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    headerSignature: text('header_signature').notNull(),
    mapping: jsonb('mapping').$type<Record<string, unknown>>().notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('mapping_presets_shop_signature_key').on(table.shopId, table.headerSignature),
  ],
);

/** A mapping preset row. */
export type MappingPresetRow = typeof mappingPresets.$inferSelect;
