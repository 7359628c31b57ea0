import type {
  DisplayPreferenceValues,
  UpdateDisplayPreferencesRequest,
} from '../../shared/contracts/preferences';
import type { Database } from '../db';
import { AppError } from '../errors/app-error';
import {
  findPreferences,
  mergePreferences,
  type SessionUserRecord,
} from '../repositories/users.repository';

/**
 * The session outlived its user (deleted between the session check and this query): the same
 * answer as any request without a valid session.
 */
function userGone(): AppError {
  return new AppError(401, 'not_signed_in', 'Sign in first');
}

/** The signed-in user's display preferences. */
export async function getPreferences(
  db: Database,
  actor: SessionUserRecord,
): Promise<DisplayPreferenceValues> {
  const preferences = await findPreferences(db, actor.id);
  if (!preferences) throw userGone();
  return preferences;
}

/**
 * Changes some of the signed-in user's display preferences and returns all of them. They are
 * personal display choices, not shop records, so no audit event is written.
 */
export async function changePreferences(
  db: Database,
  actor: SessionUserRecord,
  change: UpdateDisplayPreferencesRequest,
): Promise<DisplayPreferenceValues> {
  const preferences = await mergePreferences(db, actor.id, change);
  if (!preferences) throw userGone();
  return preferences;
}
