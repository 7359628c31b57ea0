import { z } from 'zod';

/** The roles a shop member can hold; a member may hold several. */
export const ROLES = ['admin', 'tuner', 'operator', 'reviewer'] as const;

/** One role of a shop member. */
export type Role = (typeof ROLES)[number];

/** Zod schema of one role. */
export const roleSchema = z.enum(ROLES);

/** Zod schema of a non-empty, duplicate-free list of roles. */
export const rolesSchema = z
  .array(roleSchema)
  .min(1, 'at least one role is required')
  .refine((roles) => new Set(roles).size === roles.length, 'roles must not repeat');
