import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import { invitations, shops, users, type InvitationRow, type NewInvitation } from '../../db/schema';
import type { Invitation } from '../../shared/contracts/team';
import type { Executor } from '../db';

/** The status of an invitation at `now`. */
export function invitationStatus(row: InvitationRow, now = new Date()): Invitation['status'] {
  if (row.acceptedAt) return 'accepted';
  if (row.revokedAt) return 'revoked';
  if (row.expiresAt <= now) return 'expired';
  return 'pending';
}

/** Inserts an invitation and returns its row. */
export async function insertInvitation(
  db: Executor,
  values: NewInvitation,
): Promise<InvitationRow> {
  const [row] = await db.insert(invitations).values(values).returning();
  if (!row) throw new Error('insertInvitation: no row returned');
  return row;
}

/** The shop's invitations, newest first (at most `limit`), with the inviter's name. */
export async function listInvitations(
  db: Executor,
  shopId: string,
  limit = 100,
): Promise<Invitation[]> {
  const rows = await db
    .select({ invitation: invitations, invitedBy: users.name })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.shopId, shopId))
    .orderBy(desc(invitations.createdAt))
    .limit(limit);
  return rows.map(({ invitation, invitedBy }) => toInvitation(invitation, invitedBy));
}

/** Maps a row to the API's invitation shape. */
export function toInvitation(row: InvitationRow, invitedBy: string): Invitation {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    roles: row.roles,
    status: invitationStatus(row),
    invitedBy,
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
  };
}

/** One invitation of a shop by id, or null. */
export async function findInvitation(
  db: Executor,
  shopId: string,
  id: string,
): Promise<InvitationRow | null> {
  const rows = await db
    .select()
    .from(invitations)
    .where(and(eq(invitations.shopId, shopId), eq(invitations.id, id)))
    .limit(1);
  return rows[0] ?? null;
}

/**
 * The pending invitation with this token hash and its shop's name, or null. With `lock` the
 * row is locked for the rest of the transaction, so two acceptances cannot both succeed.
 */
export async function findPendingByTokenHash(
  db: Executor,
  tokenHash: string,
  lock = false,
): Promise<{ invitation: InvitationRow; shopName: string } | null> {
  const query = db
    .select({ invitation: invitations, shopName: shops.name })
    .from(invitations)
    .innerJoin(shops, eq(shops.id, invitations.shopId))
    .where(
      and(
        eq(invitations.tokenHash, tokenHash),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, sql`now()`),
      ),
    )
    .limit(1);
  const rows = lock ? await query.for('update', { of: invitations }) : await query;
  return rows[0] ?? null;
}

/** Revokes every pending invitation of this e-mail in the shop; returns how many. */
export async function revokePendingForEmail(
  db: Executor,
  shopId: string,
  email: string,
): Promise<number> {
  const rows = await db
    .update(invitations)
    .set({ revokedAt: new Date() })
    .where(
      and(
        eq(invitations.shopId, shopId),
        eq(sql`lower(${invitations.email})`, email.toLowerCase()),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
      ),
    )
    .returning({ id: invitations.id });
  return rows.length;
}

/** Marks an invitation revoked or accepted. */
export async function closeInvitation(
  db: Executor,
  id: string,
  how: 'revoked' | 'accepted',
): Promise<void> {
  const now = new Date();
  await db
    .update(invitations)
    .set(how === 'revoked' ? { revokedAt: now } : { acceptedAt: now })
    .where(eq(invitations.id, id));
}
