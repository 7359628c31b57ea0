import { index, json, pgTable, timestamp, varchar } from 'drizzle-orm/pg-core';

/**
 * Sign-in sessions, written by connect-pg-simple. Declared here so migrations create it and
 * drizzle-kit never proposes to drop it; the column names are the store's own.
 */
export const sessions = pgTable(
  'session',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { precision: 6 }).notNull(),
  },
  (table) => [index('IDX_session_expire').on(table.expire)],
);
