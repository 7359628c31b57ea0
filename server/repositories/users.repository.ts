import { and, eq, isNull, sql } from 'drizzle-orm';
import { memberships, shops, users } from '../../db/schema';
import {
  storedDisplayPreferencesSchema,
  type DisplayPreferenceValues,
  type UpdateDisplayPreferencesRequest,
} from '../../shared/contracts/preferences';
import type { Role } from '../../shared/contracts/roles';
import type { Executor } from '../db';

/** A signed-in user as the server keeps it on `req.user`. */
export interface SessionUserRecord {
  /** The user's id. */
  id: string;
  /** Lower-cased e-mail. */
  email: string;
  /** Display name. */
  name: string;
  /** Roles held in the shop. */
  roles: Role[];
  /** The shop every query of this user is scoped to. */
  shopId: string;
  /** The shop's name. */
  shopName: string;
}

/** A user looked up for sign-in, with the hash and whether the membership is disabled. */
export interface SignInCandidate extends SessionUserRecord {
  /** The stored password hash. */
  passwordHash: string;
  /** Whether an admin disabled this member. */
  isDisabled: boolean;
}

const sessionColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  roles: memberships.roles,
  shopId: memberships.shopId,
  shopName: shops.name,
};

/** Finds the user with this e-mail (any case) and their membership, or null. */
export async function findSignInCandidate(
  db: Executor,
  email: string,
): Promise<SignInCandidate | null> {
  const rows = await db
    .select({
      ...sessionColumns,
      passwordHash: users.passwordHash,
      disabledAt: memberships.disabledAt,
    })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(sql`lower(${users.email})`, email.toLowerCase()))
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  const { disabledAt, ...rest } = row;
  return { ...rest, isDisabled: disabledAt !== null };
}

/** Loads an enabled member by user id for a session, or null (gone or disabled). */
export async function findSessionUser(
  db: Executor,
  userId: string,
): Promise<SessionUserRecord | null> {
  const rows = await db
    .select(sessionColumns)
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(and(eq(users.id, userId), isNull(memberships.disabledAt)))
    .limit(1);
  return rows[0] ?? null;
}

/** Whether any user has this e-mail (any case). */
export async function isEmailTaken(db: Executor, email: string): Promise<boolean> {
  const rows = await db
    .select({ id: users.id })
    .from(users)
    .where(eq(sql`lower(${users.email})`, email.toLowerCase()))
    .limit(1);
  return rows.length > 0;
}

/** Creates a user and their membership of one shop; returns the user's id. */
export async function insertMember(
  db: Executor,
  member: { email: string; name: string; passwordHash: string; shopId: string; roles: Role[] },
): Promise<string> {
  const [user] = await db
    .insert(users)
    .values({
      email: member.email.toLowerCase(),
      name: member.name,
      passwordHash: member.passwordHash,
    })
    .returning({ id: users.id });
  if (!user) throw new Error('insertMember: no user row returned');
  await db
    .insert(memberships)
    .values({ userId: user.id, shopId: member.shopId, roles: member.roles });
  return user.id;
}

/** A user's display preferences, or null when the user does not exist. */
export async function findPreferences(
  db: Executor,
  userId: string,
): Promise<DisplayPreferenceValues | null> {
  const rows = await db
    .select({ preferences: users.preferences })
    .from(users)
    .where(eq(users.id, userId))
    .limit(1);
  const row = rows[0];
  return row ? storedDisplayPreferencesSchema.parse(row.preferences) : null;
}

/**
 * Lays `change` over a user's stored preferences and returns the result, or null when the user
 * does not exist. The merge happens in one statement (jsonb `||`), so two tabs changing
 * different fields at the same moment both keep their change.
 */
export async function mergePreferences(
  db: Executor,
  userId: string,
  change: UpdateDisplayPreferencesRequest,
): Promise<DisplayPreferenceValues | null> {
  // Only defined fields: JSON has no undefined, and a null would overwrite a stored choice.
  const defined = Object.fromEntries(
    Object.entries(change).filter(([, value]) => value !== undefined),
  );
  const rows = await db
    .update(users)
    .set({ preferences: sql`${users.preferences} || ${JSON.stringify(defined)}::jsonb` })
    .where(eq(users.id, userId))
    .returning({ preferences: users.preferences });
  const row = rows[0];
  return row ? storedDisplayPreferencesSchema.parse(row.preferences) : null;
}
