import type { Role } from '../contracts/roles';

/** The areas of the product, one per entry of the side navigation. */
export const AREAS = ['vehicles', 'logs', 'tables', 'plans', 'reviews', 'team'] as const;

/** One area of the product. */
export type Area = (typeof AREAS)[number];

/**
 * Which roles work in each area. Reading is wider than this (every member of a shop may read
 * its vehicles, tables and revisions through the API); the navigation shows a member the areas
 * where their roles have work to do.
 */
export const AREA_ROLES: Readonly<Record<Area, readonly Role[]>> = {
  vehicles: ['admin', 'tuner', 'operator', 'reviewer'],
  logs: ['tuner', 'operator', 'reviewer'],
  tables: ['tuner', 'reviewer'],
  plans: ['tuner', 'operator'],
  reviews: ['tuner', 'reviewer'],
  team: ['admin'],
};

/** Whether a member holding `roles` has work to do in `area`. */
export function canEnterArea(roles: readonly Role[], area: Area): boolean {
  return AREA_ROLES[area].some((role) => roles.includes(role));
}

/**
 * Roles that may open an area to read it without working there. An operator reads a table's
 * coverage and lean flags to know what to log next, so the tables area opens read-only to them;
 * the navigation still lists only the areas of {@link AREA_ROLES}.
 */
export const AREA_READERS: Readonly<Partial<Record<Area, readonly Role[]>>> = {
  tables: ['operator'],
};

/** Whether a member holding `roles` may open `area`, to work there or only to read it. */
export function canReadArea(roles: readonly Role[], area: Area): boolean {
  return canEnterArea(roles, area) || hasAnyRole(roles, AREA_READERS[area] ?? []);
}

/** Whether a member holding `roles` holds at least one of `allowed`. */
export function hasAnyRole(roles: readonly Role[], allowed: readonly Role[]): boolean {
  return allowed.some((role) => roles.includes(role));
}

/** The areas a member holding `roles` sees, in navigation order. */
export function areasFor(roles: readonly Role[]): Area[] {
  return AREAS.filter((area) => canEnterArea(roles, area));
}
