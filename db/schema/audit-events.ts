import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { shops } from './shops';
import { users } from './users';

/** Something that happened in a shop and who did it, kept for the shop's records. */
export const auditEvents = pgTable(
  'audit_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    /** Null when no one was signed in (a failed sign-in, an accepted invitation). */
    actorId: uuid('actor_id').references(() => users.id, { onDelete: 'set null' }),
    action: text('action').notNull(),
    targetType: text('target_type'),
    targetId: text('target_id'),
    details: jsonb('details').$type<Record<string, unknown>>(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('audit_events_shop_created_idx').on(table.shopId, table.createdAt)],
);

/** An audit event row. */
export type AuditEvent = typeof auditEvents.$inferSelect;
/** An audit event to insert. */
export type NewAuditEvent = typeof auditEvents.$inferInsert;
