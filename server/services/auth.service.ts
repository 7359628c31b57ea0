import type { Database } from '../db';
import { recordAudit } from '../repositories/audit.repository';
import {
  findSignInCandidate,
  findSessionUser,
  type SessionUserRecord,
} from '../repositories/users.repository';
import { verifyAgainstDummy, verifyPassword } from './passwords';

/** Checks an e-mail and password; returns the member, or null for any refusal. */
export async function verifyCredentials(
  db: Database,
  email: string,
  password: string,
): Promise<SessionUserRecord | null> {
  const candidate = await findSignInCandidate(db, email);
  if (!candidate) return verifyAgainstDummy(password).then(() => null);
  const isMatch = await verifyPassword(password, candidate.passwordHash);
  if (!isMatch || candidate.isDisabled) {
    await recordAudit(db, {
      shopId: candidate.shopId,
      actorId: null,
      action: 'auth.sign_in_refused',
      targetType: 'user',
      targetId: candidate.id,
      details: { reason: isMatch ? 'disabled' : 'wrong_password' },
    });
    return null;
  }
  const { passwordHash: _hash, isDisabled: _disabled, ...user } = candidate;
  return user;
}

/** Loads the member a session points at; null when they were removed or disabled. */
export function loadSessionUser(db: Database, userId: string): Promise<SessionUserRecord | null> {
  return findSessionUser(db, userId);
}
