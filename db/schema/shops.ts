import { pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** A shop: every record of the product belongs to exactly one. */
export const shops = pgTable('shops', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  /** A stable handle used by the seed to find its shops again. */
  slug: text('slug').notNull().unique(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A shop row. */
export type Shop = typeof shops.$inferSelect;
/** A shop to insert. */
export type NewShop = typeof shops.$inferInsert;
