import { and, asc, eq } from 'drizzle-orm';
import { memberships, users } from '../../db/schema';
import type { Member } from '../../shared/contracts/team';
import type { Role } from '../../shared/contracts/roles';
import type { Executor } from '../db';

const memberColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  roles: memberships.roles,
  disabledAt: memberships.disabledAt,
  joinedAt: memberships.createdAt,
};

interface MemberRow {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  disabledAt: Date | null;
  joinedAt: Date;
}

function toMember(row: MemberRow): Member {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    roles: row.roles,
    disabled: row.disabledAt !== null,
    joinedAt: row.joinedAt.toISOString(),
  };
}

/** The members of a shop, by name. */
export async function listMembers(db: Executor, shopId: string): Promise<Member[]> {
  const rows = await db
    .select(memberColumns)
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.shopId, shopId))
    .orderBy(asc(users.name), asc(users.email));
  return rows.map(toMember);
}

/** One member of a shop by user id, or null when there is none in that shop. */
export async function findMember(
  db: Executor,
  shopId: string,
  userId: string,
): Promise<Member | null> {
  const rows = await db
    .select(memberColumns)
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)))
    .limit(1);
  return rows[0] ? toMember(rows[0]) : null;
}

/** Changes a member's roles and/or disabled state within a shop. */
export async function updateMembership(
  db: Executor,
  shopId: string,
  userId: string,
  change: { roles?: Role[]; disabled?: boolean },
): Promise<void> {
  const values: { roles?: Role[]; disabledAt?: Date | null } = {};
  if (change.roles) values.roles = change.roles;
  if (change.disabled !== undefined) values.disabledAt = change.disabled ? new Date() : null;
  await db
    .update(memberships)
    .set(values)
    .where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)));
}
