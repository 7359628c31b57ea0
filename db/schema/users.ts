import { sql } from 'drizzle-orm';
import {
  index,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { ROLES } from '../../shared/contracts/constants';
import {
  DEFAULT_DISPLAY_PREFERENCES,
  type DisplayPreferenceValues,
} from '../../shared/contracts/preferences';
import { shops } from './shops';

/** The roles a member may hold. */
export const roleEnum = pgEnum('role', ROLES);

/** A person who can sign in. E-mail addresses are stored lower-cased. */
export const users = pgTable(
  'users',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    email: text('email').notNull(),
    name: text('name').notNull(),
    /** `scrypt$N$r$p$salt$hash`, see server/services/passwords.ts. */
    passwordHash: text('password_hash').notNull(),
    /**
     * How this person wants values shown (units, mixture, colour scheme). Personal, not per
     * shop; read through `storedDisplayPreferencesSchema` so an outdated value falls back.
     */
    preferences: jsonb('preferences')
      .$type<DisplayPreferenceValues>()
      .notNull()
      .default({ ...DEFAULT_DISPLAY_PREFERENCES }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('users_email_key').on(sql`lower(${table.email})`)],
);

/** A user row. */
export type User = typeof users.$inferSelect;
/** A user to insert. */
export type NewUser = typeof users.$inferInsert;

/** A user's place in a shop, with the roles held there. */
export const memberships = pgTable(
  'memberships',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    roles: roleEnum('roles').array().notNull(),
    /** Set when an admin disabled the member: no sign-in, sessions refused. */
    disabledAt: timestamp('disabled_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    // One shop per user for now: sign-in lands the user in that shop.
    uniqueIndex('memberships_user_key').on(table.userId),
    index('memberships_shop_idx').on(table.shopId),
  ],
);

/** A membership row. */
export type Membership = typeof memberships.$inferSelect;
/** A membership to insert. */
export type NewMembership = typeof memberships.$inferInsert;
