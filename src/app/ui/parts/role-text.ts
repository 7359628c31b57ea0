import type { Role } from '@shared/contracts/roles';

/**
 * Picks the text written for the first of `roles` that has one, else `fallback`. Area pages use
 * it to describe the area from the point of view of the user's own work.
 */
export function textForRoles(
  roles: readonly Role[],
  byRole: Partial<Record<Role, string>>,
  fallback: string,
): string {
  for (const role of roles) {
    const text = byRole[role];
    if (text !== undefined) return text;
  }
  return fallback;
}
