import { index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { shops } from './shops';
import { roleEnum, users } from './users';

/** An e-mailed invitation to join a shop. Only a hash of its token is stored. */
export const invitations = pgTable(
  'invitations',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shopId: uuid('shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    name: text('name'),
    roles: roleEnum('roles').array().notNull(),
    /** SHA-256 of the token sent by e-mail, hex. */
    tokenHash: text('token_hash').notNull(),
    invitedBy: uuid('invited_by')
      .notNull()
      .references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
  },
  (table) => [
    uniqueIndex('invitations_token_hash_key').on(table.tokenHash),
    index('invitations_shop_idx').on(table.shopId),
  ],
);

/** An invitation row. */
export type InvitationRow = typeof invitations.$inferSelect;
/** An invitation to insert. */
export type NewInvitation = typeof invitations.$inferInsert;
